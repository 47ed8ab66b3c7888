import { useId, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { Button } from 'primereact/button';
import { ConfirmDialog, confirmDialog } from 'primereact/confirmdialog';
import type { ReleaseListView } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { FieldError } from '@/components/FieldError';
import { PageLoading } from '@/components/PageLoading';
import { ApiError } from '@/lib/api-client';
import { formatCount, formatPlainDate } from '@/lib/format';
import { notify } from '@/lib/notify';
import { useReleaseList } from '../api/get-release-list';
import { useReleaseResults } from '../api/release-results';
import '../release.css';

type Fields = { notes: Record<string, string> };
const NOTE_MAX = 1500;

function ReleaseForm({ view }: { view: ReleaseListView }) {
  const id = useId();
  const release = useReleaseResults(view.sitting.id);
  const [formError, setFormError] = useState<string | null>(null);
  const pending = view.results.filter((r) => !r.releasedAt);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Fields>({
    defaultValues: { notes: Object.fromEntries(pending.map((r) => [r.studentId, ''])) },
  });
  const send = (values: Fields) => {
    setFormError(null);
    const notes = Object.entries(values.notes)
      .map(([studentId, note]) => ({ studentId, note: note.trim() }))
      .filter((n) => n.note);
    release.mutate(
      { sittingId: view.sitting.id, input: { notes } },
      {
        onSuccess: (s) =>
          notify({
            severity: 'success',
            summary: `${formatCount(s.released, 'result')} released.`,
            detail: `${formatCount(s.mailed, 'take-home report')} e-mailed to students and guardians who agreed to results by e-mail.`,
          }),
        onError: (e) =>
          setFormError(
            e instanceof ApiError
              ? e.message
              : 'The server could not be reached. Nothing was released; try again.',
          ),
      },
    );
  };
  const onSubmit = handleSubmit((values) =>
    confirmDialog({
      header: 'Release results',
      message: `Release ${formatCount(pending.length, 'result')}? The students see their result, marks and comments; students, and guardians of minors who agreed to results by e-mail, receive the take-home report. A released result cannot be withdrawn here.`,
      acceptLabel: 'Release',
      rejectLabel: 'Not yet',
      accept: () => send(values),
    }),
  );
  const blocked = view.blockedBy !== null;
  return (
    <form onSubmit={onSubmit} noValidate className="sm-form">
      {formError && <Alert severity="error">{formError}</Alert>}
      <table className="sm-table sm-release-table">
        <thead>
          <tr>
            <th scope="col">Student</th>
            <th scope="col">Pupil no.</th>
            <th scope="col">Result</th>
            <th scope="col">Released</th>
            <th scope="col">Teacher’s note for the take-home report</th>
          </tr>
        </thead>
        <tbody>
          {view.results.map((r) => {
            const noteId = `${id}-${r.studentId}`;
            const err = errors.notes?.[r.studentId]?.message;
            return (
              <tr key={r.resultId}>
                <th scope="row">
                  <Link to={paths.result.href(r.resultId)}>{r.name}</Link>
                </th>
                <td>{r.pupilNumber}</td>
                <td>
                  {r.total} of {r.outOf} · {r.bandLabel}
                </td>
                <td>
                  {r.releasedAt ? formatPlainDate(r.releasedAt.slice(0, 10), 'short') : 'Not yet'}
                </td>
                <td>
                  {r.releasedAt ? (
                    (r.teacherNote ?? <span className="sm-muted">No note</span>)
                  ) : (
                    <>
                      <label htmlFor={noteId} className="sm-visually-hidden">
                        Note for {r.name}
                      </label>
                      <textarea
                        id={noteId}
                        rows={2}
                        className="p-inputtextarea p-inputtext p-component sm-release-note"
                        aria-invalid={!!err}
                        aria-describedby={`${noteId}-error`}
                        {...register(`notes.${r.studentId}`, {
                          maxLength: {
                            value: NOTE_MAX,
                            message: `A note is at most ${NOTE_MAX} characters.`,
                          },
                        })}
                      />
                      <FieldError id={`${noteId}-error`} message={err} />
                    </>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <div className="sm-form-actions">
        <Button
          type="submit"
          label={
            release.isPending ? 'Releasing…' : `Release ${formatCount(pending.length, 'result')}`
          }
          disabled={blocked || pending.length === 0 || release.isPending}
        />
      </div>
    </form>
  );
}

/** Release a sitting's results to the teacher's students (an admin's: all), with a note each. */
export function ReleasePage() {
  const { sittingId = '' } = useParams();
  const q = useReleaseList(sittingId);
  if (q.isPending) return <PageLoading />;
  if (q.isError) return <ErrorMessage error={q.error} what="the results of this sitting" />;
  const v = q.data;
  const released = v.results.filter((r) => r.releasedAt).length;
  return (
    <section aria-labelledby="release-title">
      <p className="sm-release-breadcrumb">
        <Link to={paths.sitting.href(v.sitting.id)}>{v.sitting.title}</Link> ·{' '}
        <Link to={paths.moderation.href(v.sitting.id)}>Moderation</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="release-title">Release results</h1>
          <p className="sm-page-subtitle">
            {v.sitting.title} · {formatPlainDate(v.sitting.date)} · {released} of{' '}
            {formatCount(v.results.length, 'result')} released
          </p>
        </div>
      </div>
      {v.blockedBy && (
        <Alert severity="warn">
          {v.blockedBy} <Link to={paths.moderation.href(v.sitting.id)}>Open moderation</Link>
        </Alert>
      )}
      {v.results.length === 0 ? (
        <p className="sm-muted">There are no results of your students in this sitting.</p>
      ) : (
        <ReleaseForm key={v.results.map((r) => r.releasedAt ?? '').join()} view={v} />
      )}
      <ConfirmDialog />
    </section>
  );
}
