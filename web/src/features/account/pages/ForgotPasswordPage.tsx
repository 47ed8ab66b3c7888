import { useId } from 'react';
import { Link } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { InputText } from 'primereact/inputtext';
import { Button } from 'primereact/button';
import { forgotPasswordSchema, type ForgotPasswordInput } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { useForgotPassword } from '../api/account-links';
import { AccountCard } from './AccountCard';

export function ForgotPasswordPage() {
  const id = useId();
  const forgot = useForgotPassword();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<ForgotPasswordInput>({
    resolver: zodResolver(forgotPasswordSchema),
    defaultValues: { email: '' },
  });
  const onSubmit = handleSubmit((v) => forgot.mutate(v));
  const error =
    forgot.error instanceof ApiError
      ? forgot.error.message
      : forgot.error
        ? 'The server could not be reached. Try again.'
        : null;
  return (
    <AccountCard>
      <h1>Forgot your password?</h1>
      {forgot.data ? (
        <Alert severity="success">{forgot.data.message}</Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="sm-form">
          <p>
            Give the e-mail address you sign in with, and we will send it a link to choose a new
            password.
          </p>
          {error && <Alert severity="error">{error}</Alert>}
          <div className="sm-field">
            <label htmlFor={`${id}-email`}>E-mail</label>
            <InputText
              id={`${id}-email`}
              type="email"
              autoComplete="username"
              invalid={!!errors.email}
              aria-describedby={`${id}-email-error`}
              {...register('email')}
            />
            <FieldError id={`${id}-email-error`} message={errors.email?.message} />
          </div>
          <Button
            type="submit"
            label="Send me a link"
            className="sm-form-submit"
            loading={forgot.isPending}
          />
        </form>
      )}
      <p>
        <Link to={paths.signIn.href()}>Back to sign-in</Link>
      </p>
    </AccountCard>
  );
}
