import { useEffect, useId, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { updateUserSchema, type UpdateUserInput, type UserRow } from '@stavemark/shared';
import type { z } from 'zod';
import { applyApiErrors } from '@/lib/form-errors';
import { FieldError } from '@/components/FieldError';
import { useUpdateUser } from '../api/update-user';
import { RolesField } from './RolesField';
import { Alert } from '@/components/Alert';

type Fields = z.input<typeof updateUserSchema>;
const FIELDS = ['displayName', 'roles'] as const;

interface Props {
  person: UserRow | null;
  onHide: () => void;
}

/** Name and roles; activation has its own buttons in the table. */
export function EditPersonDialog({ person, onHide }: Props) {
  const id = useId();
  const updateUser = useUpdateUser({ inlineErrors: true });
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    control,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<Fields, unknown, z.output<typeof updateUserSchema>>({
    resolver: zodResolver(updateUserSchema),
    defaultValues: { displayName: '', roles: [] },
  });

  useEffect(() => {
    if (person) reset({ displayName: person.displayName, roles: person.roles });
  }, [person, reset]);

  const close = () => {
    setFormError(null);
    updateUser.reset();
    onHide();
  };

  const onSubmit = handleSubmit((values) => {
    if (!person) return;
    // Send only what changed, so a concurrent change to another field is not overwritten.
    const changes: UpdateUserInput = {};
    if (values.displayName !== undefined && values.displayName !== person.displayName)
      changes.displayName = values.displayName;
    if (values.roles && values.roles.join() !== person.roles.join()) changes.roles = values.roles;
    if (Object.keys(changes).length === 0) return close();
    setFormError(null);
    updateUser.mutate(
      { id: person.id, changes },
      {
        onSuccess: close,
        onError: (error) => setFormError(applyApiErrors(error, setError, FIELDS)),
      },
    );
  });

  const footer = (
    <div className="sm-form-actions">
      <Button type="button" label="Cancel" severity="secondary" onClick={close} />
      <Button
        type="submit"
        form={`${id}-form`}
        label={updateUser.isPending ? 'Saving…' : 'Save changes'}
        disabled={updateUser.isPending}
      />
    </div>
  );

  return (
    <Dialog
      header={person ? `Edit ${person.displayName}` : 'Edit'}
      visible={person !== null}
      onHide={close}
      footer={footer}
      style={{ width: '30rem' }}
      breakpoints={{ '640px': '95vw' }}
    >
      <form id={`${id}-form`} onSubmit={onSubmit} noValidate className="sm-form">
        {formError && <Alert severity="error">{formError}</Alert>}
        <p className="sm-muted">{person?.email}</p>
        <div className="sm-field">
          <label htmlFor={`${id}-name`}>Name</label>
          <InputText
            id={`${id}-name`}
            autoComplete="off"
            invalid={!!errors.displayName}
            aria-invalid={!!errors.displayName}
            aria-describedby={errors.displayName ? `${id}-name-error` : undefined}
            {...register('displayName')}
          />
          <FieldError id={`${id}-name-error`} message={errors.displayName?.message} />
        </div>
        <Controller
          control={control}
          name="roles"
          render={({ field, fieldState }) => (
            <RolesField
              value={field.value ?? []}
              onChange={field.onChange}
              error={fieldState.error?.message}
            />
          )}
        />
      </form>
    </Dialog>
  );
}
