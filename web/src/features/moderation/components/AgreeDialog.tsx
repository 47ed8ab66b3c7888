import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputTextarea } from 'primereact/inputtextarea';
import {
  agreeMarksSchema,
  type ModerationPairView,
  type ModerationSheetView,
} from '@stavemark/shared';
import type { z } from 'zod';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notify';
import { useAgreeMarks } from '../api/agree-marks';

type Fields = z.input<typeof agreeMarksSchema>;

function marksFrom(
  pair: ModerationPairView,
  sheet: ModerationSheetView | null,
): Record<string, number> {
  const out: Record<string, number> = {};
  for (const r of pair.requests)
    for (const c of r.criteria) {
      const cell = `mark:${r.index}:${c.key}`;
      const v = sheet?.cells.find((x) => x.cell === cell)?.value;
      out[cell] = typeof v === 'number' ? v : 0;
    }
  return out;
}

/**
 * Agreed marks for a flagged pair: a mark for every criterion, starting from one examiner's
 * sheet, and in a sentence why. The result is recomputed from these marks and the agreement is
 * recorded with who and why.
 */
export function AgreeDialog({
  sittingId,
  pair,
  onHide,
}: {
  sittingId: string;
  pair: ModerationPairView;
  onHide: () => void;
}) {
  const id = useId();
  const agree = useAgreeMarks(sittingId);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    getValues,
    formState: { errors },
  } = useForm<Fields, unknown, z.output<typeof agreeMarksSchema>>({
    resolver: zodResolver(agreeMarksSchema),
    defaultValues: { marks: marksFrom(pair, pair.first), notAsked: [], reason: '' },
  });
  const startFrom = (sheet: ModerationSheetView | null) =>
    reset({ ...getValues(), marks: marksFrom(pair, sheet) });
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    agree.mutate(
      { slotId: pair.slotId, input: values },
      {
        onSuccess: () => {
          notify({
            severity: 'success',
            summary: `Marks agreed for ${pair.candidate.name}; the result is recomputed.`,
          });
          onHide();
        },
        onError: (e) =>
          setFormError(
            e instanceof ApiError
              ? [e.message, ...e.fieldErrors.map((d) => d.message)]
                  .filter((m, i, a) => a.indexOf(m) === i)
                  .join(' ')
              : 'The server could not be reached. Nothing was saved; try again.',
          ),
      },
    );
  });
  const markErrors = errors.marks as Record<string, { message?: string }> | undefined;
  return (
    <Dialog
      header={`Agree marks: ${pair.candidate.name}`}
      visible
      onHide={onHide}
      style={{ width: 'min(46rem, 96vw)' }}
      modal
    >
      <form onSubmit={onSubmit} noValidate className="sm-form">
        {formError && <Alert severity="error">{formError}</Alert>}
        <p>
          Listen again or talk it through with both examiners, then enter the marks you agree on.
          The reason is kept in the audit trail with your name.
        </p>
        <div className="sm-row-actions">
          <Button
            type="button"
            severity="secondary"
            label="Start from the first examiner’s marks"
            onClick={() => startFrom(pair.first)}
          />
          <Button
            type="button"
            severity="secondary"
            label="Start from the second examiner’s marks"
            onClick={() => startFrom(pair.second)}
          />
        </div>
        <div className="sm-mod-agree-grid">
          {pair.requests.map((r) => (
            <fieldset key={r.index} className="sm-mod-agree-request">
              <legend>
                {r.index + 1}. {r.label}
              </legend>
              {r.criteria.map((c) => {
                const cell = `mark:${r.index}:${c.key}`;
                const inputId = `${id}-${r.index}-${c.key}`;
                const err = markErrors?.[cell]?.message;
                return (
                  <div key={c.key} className="sm-mod-agree-field">
                    <label htmlFor={inputId}>
                      {c.label} <span className="sm-muted">(0–{c.maxMark})</span>
                    </label>
                    <input
                      id={inputId}
                      type="number"
                      min={0}
                      max={c.maxMark}
                      step={1}
                      className="p-inputtext p-component sm-mod-mark"
                      aria-invalid={!!err}
                      aria-describedby={`${inputId}-error`}
                      {...register(`marks.${cell}`, {
                        valueAsNumber: true,
                        max: {
                          value: c.maxMark,
                          message: `${c.label} is marked out of ${c.maxMark}.`,
                        },
                      })}
                    />
                    <FieldError id={`${inputId}-error`} message={err} />
                  </div>
                );
              })}
            </fieldset>
          ))}
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-reason`}>Why these marks</label>
          <InputTextarea
            id={`${id}-reason`}
            rows={3}
            invalid={!!errors.reason}
            aria-describedby={`${id}-reason-error`}
            {...register('reason')}
          />
          <FieldError id={`${id}-reason-error`} message={errors.reason?.message} />
        </div>
        <div className="sm-form-actions">
          <Button type="button" label="Cancel" severity="secondary" onClick={onHide} />
          <Button
            type="submit"
            label={agree.isPending ? 'Saving…' : 'Record the agreed marks'}
            disabled={agree.isPending}
          />
        </div>
      </form>
    </Dialog>
  );
}
