import { useId, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { createUserSchema, PASSWORD_MIN_LENGTH, type UserRow } from '@stavemark/shared';
import type { z } from 'zod';
import { ApiError } from '@/lib/api-client';
import { applyApiErrors } from '@/lib/form-errors';
import { FieldError } from '@/components/FieldError';
import { useCreateUser } from '../api/create-user';
import { RolesField } from './RolesField';
import { Alert } from '@/components/Alert';

type Fields = z.input<typeof createUserSchema>;
const FIELDS = ['email', 'displayName', 'roles', 'password'] as const;

interface Props {
  visible: boolean;
  onHide: () => void;
  onCreated: (row: UserRow) => void;
}

export function CreatePersonDialog({ visible, onHide, onCreated }: Props) {
  const id = useId();
  const createUser = useCreateUser();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    control,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<Fields, unknown, z.output<typeof createUserSchema>>({
    resolver: zodResolver(createUserSchema),
    defaultValues: { email: '', displayName: '', roles: [], password: undefined },
  });

  const close = () => {
    reset();
    setFormError(null);
    createUser.reset();
    onHide();
  };

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    createUser.mutate(values, {
      onSuccess: (row) => {
        close();
        onCreated(row);
      },
      onError: (error) => {
        // 409: the e-mail already belongs to someone here; say so beside the e-mail.
        if (error instanceof ApiError && error.status === 409)
          setError('email', { type: 'server', message: error.message });
        else setFormError(applyApiErrors(error, setError, FIELDS));
      },
    });
  });

  const footer = (
    <div className="sm-form-actions">
      <Button type="button" label="Cancel" severity="secondary" onClick={close} />
      <Button
        type="submit"
        form={`${id}-form`}
        label={createUser.isPending ? 'Adding…' : 'Add person'}
        disabled={createUser.isPending}
      />
    </div>
  );

  return (
    <Dialog
      header="Add a person"
      visible={visible}
      onHide={close}
      footer={footer}
      style={{ width: '30rem' }}
      breakpoints={{ '640px': '95vw' }}
    >
      <form id={`${id}-form`} onSubmit={onSubmit} noValidate className="sm-form">
        {formError && <Alert severity="error">{formError}</Alert>}
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
        <div className="sm-field">
          <label htmlFor={`${id}-email`}>E-mail</label>
          <InputText
            id={`${id}-email`}
            type="email"
            autoComplete="off"
            invalid={!!errors.email}
            aria-invalid={!!errors.email}
            aria-describedby={errors.email ? `${id}-email-error` : undefined}
            {...register('email')}
          />
          <FieldError id={`${id}-email-error`} message={errors.email?.message} />
        </div>
        <Controller
          control={control}
          name="roles"
          render={({ field, fieldState }) => (
            <RolesField
              value={field.value}
              onChange={field.onChange}
              error={fieldState.error?.message}
            />
          )}
        />
        <div className="sm-field">
          <label htmlFor={`${id}-password`}>First password (optional)</label>
          <InputText
            id={`${id}-password`}
            type="password"
            autoComplete="new-password"
            invalid={!!errors.password}
            aria-invalid={!!errors.password}
            aria-describedby={`${id}-password-hint${errors.password ? ` ${id}-password-error` : ''}`}
            {...register('password', { setValueAs: (v: string) => (v === '' ? undefined : v) })}
          />
          <small id={`${id}-password-hint`} className="sm-field-hint">
            At least {PASSWORD_MIN_LENGTH} characters. Leave it empty to send an e-mail invitation
            to choose one.
          </small>
          <FieldError id={`${id}-password-error`} message={errors.password?.message} />
        </div>
      </form>
    </Dialog>
  );
}
