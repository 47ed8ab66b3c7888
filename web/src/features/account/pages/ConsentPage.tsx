import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Button } from 'primereact/button';
import { RadioButton } from 'primereact/radiobutton';
import { Alert } from '@/components/Alert';
import { PageLoading } from '@/components/PageLoading';
import { ApiError } from '@/lib/api-client';
import { getConsentRequest, useSubmitConsent } from '../api/account-links';
import { AccountCard } from './AccountCard';
import { useLinkToken } from './use-link-token';

type Answer = { results: boolean | null; recordings: boolean | null };

function YesNo({
  name,
  legend,
  value,
  onChange,
}: {
  name: string;
  legend: string;
  value: boolean | null;
  onChange: (v: boolean) => void;
}) {
  return (
    <fieldset className="sm-fieldset">
      <legend>{legend}</legend>
      <div className="sm-checks">
        {[true, false].map((v) => (
          <span className="sm-check" key={String(v)}>
            <RadioButton
              inputId={`${name}-${v}`}
              name={name}
              value={v}
              checked={value === v}
              onChange={() => onChange(v)}
            />
            <label htmlFor={`${name}-${v}`}>{v ? 'Yes' : 'No'}</label>
          </span>
        ))}
      </div>
    </fieldset>
  );
}

/** A guardian's answers to the two consent questions, for each of their children at the school. */
export function ConsentPage() {
  const token = useLinkToken();
  const request = useQuery({
    queryKey: ['consent', token],
    queryFn: () => getConsentRequest(token),
    enabled: token.length > 0,
    retry: false,
    staleTime: Infinity,
  });
  const submit = useSubmitConsent();
  const [answers, setAnswers] = useState<Record<string, Answer>>({});
  const [missing, setMissing] = useState(false);

  if (token && request.isPending) return <PageLoading />;
  if (!token || request.isError) {
    const message =
      request.error instanceof ApiError
        ? request.error.message
        : 'This link cannot be used: it is incomplete, has expired, or was used already.';
    return (
      <AccountCard>
        <h1>Your answers for the school</h1>
        <Alert severity="error">{message}</Alert>
        <p>
          If you would still like to answer, please write to the school and they will send a fresh
          link.
        </p>
      </AccountCard>
    );
  }
  const r = request.data!;
  const of = (id: string): Answer => answers[id] ?? { results: null, recordings: null };
  const set = (id: string, patch: Partial<Answer>) =>
    setAnswers((a) => ({ ...a, [id]: { ...of(id), ...patch } }));
  const onSubmit = (e: React.FormEvent) => {
    e.preventDefault();
    const complete = r.children.every(
      (c) => of(c.studentId).results !== null && of(c.studentId).recordings !== null,
    );
    setMissing(!complete);
    if (!complete) return;
    submit.mutate({
      token,
      answers: r.children.map((c) => ({
        studentId: c.studentId,
        consentResultsEmail: of(c.studentId).results!,
        consentRecordings: of(c.studentId).recordings!,
      })),
    });
  };

  return (
    <AccountCard>
      <h1>Your answers for {r.organisationName}</h1>
      {submit.data ? (
        <Alert severity="success">{submit.data.message}</Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="sm-form">
          <p>
            Hello {r.guardianName}. Until you answer, the school will not e-mail results or make
            recordings. You can change your mind later by writing to the school.
          </p>
          {missing && <Alert severity="error">Please answer both questions for each child.</Alert>}
          {submit.error && (
            <Alert severity="error">
              {submit.error instanceof ApiError
                ? submit.error.message
                : 'The server could not be reached. Try again.'}
            </Alert>
          )}
          {r.children.map((c) => (
            <fieldset key={c.studentId} className="sm-consent-child">
              <legend>{c.givenName}</legend>
              <YesNo
                name={`${c.studentId}-results`}
                legend={`May we send ${c.givenName}’s results to you by e-mail?`}
                value={of(c.studentId).results}
                onChange={(v) => set(c.studentId, { results: v })}
              />
              <YesNo
                name={`${c.studentId}-recordings`}
                legend={`May we make audio or video recordings of ${c.givenName} playing, for marking and practice?`}
                value={of(c.studentId).recordings}
                onChange={(v) => set(c.studentId, { recordings: v })}
              />
            </fieldset>
          ))}
          <Button
            type="submit"
            label="Send my answers"
            className="sm-form-submit"
            loading={submit.isPending}
          />
        </form>
      )}
    </AccountCard>
  );
}
