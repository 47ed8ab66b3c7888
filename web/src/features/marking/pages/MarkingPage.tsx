import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useMarkingToday } from '../api/get-marking-today';
import '../marking.css';

const SHEET: Record<string, string> = { draft: 'Being marked', submitted: 'Submitted' };

/** The examiner's day: today's sittings and the slots they mark, each opening its desk. */
export function MarkingPage() {
  const today = useMarkingToday();
  return (
    <section className="sm-desk" aria-labelledby="marking-title">
      <div className="sm-page-header">
        <h1 id="marking-title">Marking today</h1>
      </div>
      {today.isPending ? (
        <PageLoading />
      ) : today.isError ? (
        <ErrorMessage error={today.error} what="today’s marking" />
      ) : today.data.length === 0 ? (
        <p className="sm-muted">No slots are assigned to you today.</p>
      ) : (
        <div className="sm-desk-list">
          {today.data.map((s) => (
            <section key={s.id} aria-labelledby={`sitting-${s.id}`}>
              <h2 id={`sitting-${s.id}`}>
                {s.title}{' '}
                <span className="sm-muted">
                  · {s.room} · {s.status.replace('_', ' ')}
                </span>
              </h2>
              <table>
                <thead>
                  <tr>
                    <th>Time</th>
                    <th>Candidate</th>
                    <th>List</th>
                    <th>You mark</th>
                    <th>Sheet</th>
                  </tr>
                </thead>
                <tbody>
                  {s.slots.map((x) => (
                    <tr key={x.id}>
                      <td>
                        {x.startTime}–{x.endTime}
                      </td>
                      <td>
                        <Link to={paths.markingDesk.href(x.id)}>{x.candidate}</Link>
                      </td>
                      <td>{x.listName}</td>
                      <td>{x.role === 'first' ? 'First' : x.role === 'second' ? 'Second (blind)' : 'Third (blind, moderation)'}</td>
                      <td>
                        {x.sheetStatus
                          ? SHEET[x.sheetStatus]
                          : x.outcome
                            ? x.outcome
                            : 'Not started'}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </section>
          ))}
        </div>
      )}
    </section>
  );
}
