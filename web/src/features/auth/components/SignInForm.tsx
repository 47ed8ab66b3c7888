import { useEffect, useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { InputText } from 'primereact/inputtext';
import { Button } from 'primereact/button';
import { loginSchema } from '@stavemark/shared';
import type { z } from 'zod';
import { ApiError } from '@/lib/api-client';
import { FieldError } from '@/components/FieldError';
import { useLogin } from '../api/login';
import { Alert } from '@/components/Alert';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';

type LoginFields = z.input<typeof loginSchema>;

/** Seconds left before another attempt is allowed, counting down once a second. */
function useCountdown(): [number, (seconds: number) => void] {
  const [left, setLeft] = useState(0);
  useEffect(() => {
    if (left <= 0) return;
    const timer = setTimeout(() => setLeft((s) => s - 1), 1000);
    return () => clearTimeout(timer);
  }, [left]);
  return [left, setLeft];
}

function waitText(seconds: number): string {
  if (seconds >= 120) return `about ${Math.ceil(seconds / 60)} minutes`;
  return seconds === 1 ? '1 second' : `${seconds} seconds`;
}

/** On success the session store switches to signed-in and the page redirects. */
export function SignInForm() {
  const id = useId();
  const login = useLogin();
  const [waitSeconds, startWait] = useCountdown();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<LoginFields, unknown, z.output<typeof loginSchema>>({
    resolver: zodResolver(loginSchema),
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit((values) => {
    login.mutate(values, {
      onError: (error) => {
        if (error instanceof ApiError && error.status === 429)
          startWait(error.retryAfterSeconds ?? 60);
      },
    });
  });

  const error = login.error;
  let alert: string | null = null;
  if (error instanceof ApiError && error.status === 429) {
    // The API's message names the wait at the moment of refusal; the button counts it down.
    alert = waitSeconds > 0 ? error.message : 'You can try to sign in again now.';
  } else if (error instanceof ApiError) {
    alert = error.message;
  } else if (error) {
    alert = 'The server could not be reached. Check the connection and try again.';
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby={`${id}-title`} className="sm-form">
      <h1 id={`${id}-title`}>Sign in</h1>
      {alert && <Alert severity="error">{alert}</Alert>}
      <div className="sm-field">
        <label htmlFor={`${id}-email`}>E-mail</label>
        <InputText
          id={`${id}-email`}
          type="email"
          autoComplete="username"
          invalid={!!errors.email}
          aria-invalid={!!errors.email}
          aria-describedby={errors.email ? `${id}-email-error` : undefined}
          {...register('email')}
        />
        <FieldError id={`${id}-email-error`} message={errors.email?.message} />
      </div>
      <div className="sm-field">
        <label htmlFor={`${id}-password`}>Password</label>
        <InputText
          id={`${id}-password`}
          type="password"
          autoComplete="current-password"
          invalid={!!errors.password}
          aria-invalid={!!errors.password}
          aria-describedby={errors.password ? `${id}-password-error` : undefined}
          {...register('password')}
        />
        <FieldError id={`${id}-password-error`} message={errors.password?.message} />
      </div>
      <Button
        type="submit"
        label={
          login.isPending
            ? 'Signing in…'
            : waitSeconds > 0
              ? `Try again in ${waitText(waitSeconds)}`
              : 'Sign in'
        }
        disabled={login.isPending || waitSeconds > 0}
        className="sm-form-submit"
      />
      <p className="sm-muted">
        <Link to={paths.forgotPassword.href()}>Forgotten your password?</Link>
      </p>
    </form>
  );
}
