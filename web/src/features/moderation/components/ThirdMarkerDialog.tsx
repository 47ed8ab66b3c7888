import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputTextarea } from 'primereact/inputtextarea';
import { thirdMarkerSchema, type ModerationPairView, type ModerationView } from '@stavemark/shared';
import type { z } from 'zod';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import { applyApiErrors } from '@/lib/form-errors';
import { notify } from '@/lib/notify';
import { useSendToThird } from '../api/send-to-third';

type Fields = z.input<typeof thirdMarkerSchema>;

/** Hands a flagged pair to a third examiner, who marks the slot blind on their marking desk. */
export function ThirdMarkerDialog({
  view,
  pair,
  onHide,
}: {
  view: ModerationView;
  pair: ModerationPairView;
  onHide: () => void;
}) {
  const id = useId();
  const send = useSendToThird(view.sitting.id);
  const [formError, setFormError] = useState<string | null>(null);
  // Neither of the pair's own examiners may third-mark it.
  const choices = view.examiners.filter(
    (e) => e.id !== pair.first?.examiner.id && e.id !== pair.second?.examiner.id,
  );
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Fields, unknown, z.output<typeof thirdMarkerSchema>>({
    resolver: zodResolver(thirdMarkerSchema),
    defaultValues: { examinerId: pair.thirdExaminer?.id ?? '', note: '' },
  });
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    send.mutate(
      {
        slotId: pair.slotId,
        input: { examinerId: values.examinerId, ...(values.note ? { note: values.note } : {}) },
      },
      {
        onSuccess: () => {
          const who =
            choices.find((c) => c.id === values.examinerId)?.displayName ?? 'The examiner';
          notify({
            severity: 'success',
            summary: `${who} is asked to third-mark ${pair.candidate.name}.`,
          });
          onHide();
        },
        onError: (e) => setFormError(applyApiErrors(e, setError, ['examinerId', 'note'])),
      },
    );
  });
  return (
    <Dialog
      header={`Third marker: ${pair.candidate.name}`}
      visible
      onHide={onHide}
      style={{ width: 'min(30rem, 96vw)' }}
      modal
    >
      <form onSubmit={onSubmit} noValidate className="sm-form">
        {formError && <Alert severity="error">{formError}</Alert>}
        <p>
          The third examiner marks this candidate on their marking desk without seeing either sheet;
          their marks then give the result. They are told by e-mail.
        </p>
        <div className="sm-field">
          <label htmlFor={`${id}-examiner`}>Examiner</label>
          <select
            id={`${id}-examiner`}
            className="p-inputtext p-component"
            aria-invalid={!!errors.examinerId}
            aria-describedby={`${id}-examiner-error`}
            {...register('examinerId')}
          >
            <option value="">Choose an examiner…</option>
            {choices.map((e) => (
              <option key={e.id} value={e.id}>
                {e.displayName}
              </option>
            ))}
          </select>
          <FieldError id={`${id}-examiner-error`} message={errors.examinerId?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-note`}>Note for the examiner (optional)</label>
          <InputTextarea id={`${id}-note`} rows={2} {...register('note')} />
          <FieldError id={`${id}-note-error`} message={errors.note?.message} />
        </div>
        <div className="sm-form-actions">
          <Button type="button" label="Cancel" severity="secondary" onClick={onHide} />
          <Button
            type="submit"
            label={send.isPending ? 'Sending…' : 'Ask for third marking'}
            disabled={send.isPending || choices.length === 0}
          />
        </div>
      </form>
    </Dialog>
  );
}
