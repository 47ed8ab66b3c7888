import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Button } from 'primereact/button';
import { Password } from 'primereact/password';
import { Controller } from 'react-hook-form';
import { passwordSchema, PASSWORD_MIN_LENGTH } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import { PageLoading } from '@/components/PageLoading';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { getLinkInfo, useSetPassword } from '../api/account-links';
import { AccountCard } from './AccountCard';
import { useLinkToken } from './use-link-token';

const schema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, {
    path: ['confirm'],
    message: 'The two passwords are not the same.',
  });
type Fields = z.infer<typeof schema>;

const GONE = 'This link cannot be used: it is incomplete, has expired, or was used already.';

/** Choosing a password through an invitation (first password) or a reset link. */
export function SetPasswordPage({ purpose }: { purpose: 'invitation' | 'password_reset' }) {
  const id = useId();
  const token = useLinkToken();
  const info = useQuery({
    queryKey: ['account-link', token],
    queryFn: () => getLinkInfo(token),
    enabled: token.length > 0,
    retry: false,
    staleTime: Infinity,
  });
  const setPassword = useSetPassword(purpose);
  const [done, setDone] = useState<string | null>(null);
  const {
    control,
    handleSubmit,
    formState: { errors },
  } = useForm<Fields>({
    resolver: zodResolver(schema),
    defaultValues: { password: '', confirm: '' },
  });

  const title = purpose === 'invitation' ? 'Welcome to Stavemark' : 'Choose a new password';
  if (token && info.isPending) return <PageLoading />;
  const linkProblem = !token
    ? GONE
    : info.isError
      ? info.error instanceof ApiError
        ? info.error.message
        : GONE
      : null;
  const wrongKind = info.data && info.data.purpose !== purpose;

  const onSubmit = handleSubmit((v) =>
    setPassword.mutate({ token, password: v.password }, { onSuccess: (r) => setDone(r.message) }),
  );
  const submitError =
    setPassword.error instanceof ApiError
      ? setPassword.error.message
      : setPassword.error
        ? 'The server could not be reached. Try again.'
        : null;

  return (
    <AccountCard>
      <h1>{title}</h1>
      {done ? (
        <>
          <Alert severity="success">{done}</Alert>
          <p>
            <Link to={paths.signIn.href()}>Go to sign-in</Link>
          </p>
        </>
      ) : linkProblem || wrongKind ? (
        <>
          <Alert severity="error">{wrongKind ? GONE : linkProblem}</Alert>
          <p>
            You can <Link to={paths.forgotPassword.href()}>ask for a fresh link</Link>; it comes by
            e-mail within a minute.
          </p>
        </>
      ) : (
        <form onSubmit={onSubmit} noValidate className="sm-form" aria-labelledby={`${id}-lead`}>
          <p id={`${id}-lead`}>
            {`Hello ${info.data?.displayName}. `}
            {purpose === 'invitation'
              ? `Choose a password for your account${info.data?.organisationName ? ` at ${info.data.organisationName}` : ''}.`
              : 'Choose a new password; you will be signed out everywhere else.'}
          </p>
          {submitError && <Alert severity="error">{submitError}</Alert>}
          <div className="sm-field">
            <label htmlFor={`${id}-password`}>New password</label>
            <Controller
              name="password"
              control={control}
              render={({ field }) => (
                <Password
                  inputId={`${id}-password`}
                  value={field.value}
                  onChange={(e) => field.onChange(e.target.value)}
                  onBlur={field.onBlur}
                  feedback={false}
                  toggleMask
                  className="sm-password-full"
                  autoComplete="new-password"
                  invalid={!!errors.password}
                  aria-describedby={`${id}-password-hint ${id}-password-error`}
                />
              )}
            />
            <small id={`${id}-password-hint`} className="sm-field-hint">
              At least {PASSWORD_MIN_LENGTH} characters. A short sentence is easy to remember.
            </small>
            <FieldError id={`${id}-password-error`} message={errors.password?.message} />
          </div>
          <div className="sm-field">
            <label htmlFor={`${id}-confirm`}>The same password again</label>
            <Controller
              name="confirm"
              control={control}
              render={({ field }) => (
                <Password
                  inputId={`${id}-confirm`}
                  value={field.value}
                  onChange={(e) => field.onChange(e.target.value)}
                  onBlur={field.onBlur}
                  feedback={false}
                  toggleMask
                  className="sm-password-full"
                  autoComplete="new-password"
                  invalid={!!errors.confirm}
                  aria-describedby={`${id}-confirm-error`}
                />
              )}
            />
            <FieldError id={`${id}-confirm-error`} message={errors.confirm?.message} />
          </div>
          <Button
            type="submit"
            label="Save my password"
            className="sm-form-submit"
            loading={setPassword.isPending}
          />
        </form>
      )}
    </AccountCard>
  );
}
