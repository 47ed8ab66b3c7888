import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { createClassSchema, type ClassRow } from '@stavemark/shared';
import type { z } from 'zod';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import { applyApiErrors } from '@/lib/form-errors';
import { useCreateClass } from '../api/create-class';

type Fields = z.input<typeof createClassSchema>;

export function CreateClassDialog({
  visible,
  onHide,
  onCreated,
}: {
  visible: boolean;
  onHide: () => void;
  onCreated: (c: ClassRow) => void;
}) {
  const id = useId();
  const create = useCreateClass();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<Fields, unknown, z.output<typeof createClassSchema>>({
    resolver: zodResolver(createClassSchema),
    defaultValues: { name: '', code: '' },
  });
  const close = () => {
    reset();
    create.reset();
    onHide();
  };
  const [formError, setFormError] = useState<string | null>(null);
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    create.mutate(values, {
      onSuccess: (c) => {
        onCreated(c);
        close();
      },
      onError: (error) => setFormError(applyApiErrors(error, setError, ['name', 'code'])),
    });
  });
  return (
    <Dialog
      header="New class"
      visible={visible}
      onHide={close}
      style={{ width: 'min(28rem, 96vw)' }}
      modal
    >
      <form onSubmit={onSubmit} noValidate className="sm-form">
        {formError && <Alert severity="error">{formError}</Alert>}
        <div className="sm-field">
          <label htmlFor={`${id}-name`}>Name</label>
          <InputText
            id={`${id}-name`}
            invalid={!!errors.name}
            aria-describedby={`${id}-name-error`}
            {...register('name')}
          />
          <FieldError id={`${id}-name-error`} message={errors.name?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-code`}>Class code</label>
          <InputText
            id={`${id}-code`}
            invalid={!!errors.code}
            aria-describedby={`${id}-code-hint ${id}-code-error`}
            {...register('code')}
          />
          <small id={`${id}-code-hint`} className="sm-field-hint">
            The code class lists use, e.g. TUE-BEG.
          </small>
          <FieldError id={`${id}-code-error`} message={errors.code?.message} />
        </div>
        <div className="sm-form-actions">
          <Button type="button" label="Cancel" severity="secondary" onClick={close} />
          <Button type="submit" label="Create the class" loading={create.isPending} />
        </div>
      </form>
    </Dialog>
  );
}
