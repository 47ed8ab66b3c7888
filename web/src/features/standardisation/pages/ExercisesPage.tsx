import { Link } from 'react-router-dom';
import { Tag } from 'primereact/tag';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { paths } from '@/config/paths';
import { hasAnyRole, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { useExercises } from '../api/get-exercises';
import '../standardisation.css';

/** Reference performances to mark before a sitting, and where each stands for the caller. */
export function ExercisesPage() {
  const me = useCurrentUser();
  const examiner = hasAnyRole(me, ['examiner']);
  const writer = hasAnyRole(me, ['admin', 'teacher']);
  const exercises = useExercises();
  return (
    <section aria-labelledby="std-title">
      <div className="sm-page-header">
        <div>
          <h1 id="std-title">Standardisation</h1>
          <p className="sm-page-subtitle">
            Reference performances with agreed marks. Mark each one on your own before the sitting; the reference appears once you submit.
          </p>
        </div>
        <div className="sm-row-actions">
          {examiner && (
            <Link className="p-button p-button-secondary" to={paths.standardisationDeviations.href()}>
              My deviation over time
            </Link>
          )}
          {writer && (
            <Link className="p-button" to={paths.standardisationNew.href()}>
              New exercise
            </Link>
          )}
        </div>
      </div>
      {exercises.isPending && <PageLoading />}
      {exercises.isError && <ErrorMessage error={exercises.error} what="the exercises" />}
      {exercises.data && exercises.data.length === 0 && <p className="sm-muted">No exercise has been published yet.</p>}
      {exercises.data && exercises.data.length > 0 && (
        <div className="sm-table-wrap">
          <table className="sm-table">
            <thead>
              <tr>
                <th scope="col">Exercise</th>
                <th scope="col">Rubric</th>
                <th scope="col">Mark by</th>
                <th scope="col" className="sm-num">
                  Submitted
                </th>
                <th scope="col">You</th>
              </tr>
            </thead>
            <tbody>
              {exercises.data.map((e) => (
                <tr key={e.id}>
                  <td>
                    <Link to={paths.standardisationExercise.href(e.id)}>{e.title}</Link>{' '}
                    {e.status === 'draft' && <Tag severity="warning" value="Draft" />}
                  </td>
                  <td>{e.rubricName}</td>
                  <td>{e.dueOn ? formatPlainDate(e.dueOn, 'short') : '—'}</td>
                  <td className="sm-num">{e.submittedAttempts}</td>
                  <td>
                    {e.canManage
                      ? 'You manage it'
                      : e.myAttempt?.status === 'submitted'
                        ? 'Submitted'
                        : e.myAttempt
                          ? 'Started'
                          : examiner
                            ? 'To mark'
                            : '—'}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
