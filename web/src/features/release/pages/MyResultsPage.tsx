import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { formatPlainDate } from '@/lib/format';
import { useMyResults } from '../api/get-my-results';
import '../release.css';

/** The student's released results, newest first, each opening its take-home report. */
export function MyResultsPage() {
  const q = useMyResults();
  if (q.isPending) return <PageLoading />;
  if (q.isError) return <ErrorMessage error={q.error} what="your results" />;
  return (
    <section aria-labelledby="my-results-title">
      <div className="sm-page-header">
        <div>
          <h1 id="my-results-title">My results</h1>
          <p className="sm-page-subtitle">Mock-exam results your teacher has released to you.</p>
        </div>
      </div>
      {q.data.length === 0 ? (
        <p className="sm-muted">No results have been released to you yet.</p>
      ) : (
        <table className="sm-table">
          <thead>
            <tr>
              <th scope="col">Mock exam</th>
              <th scope="col">Date</th>
              <th scope="col">Result</th>
              <th scope="col">Report</th>
            </tr>
          </thead>
          <tbody>
            {q.data.map((r) => (
              <tr key={r.id}>
                <th scope="row">{r.sittingTitle}</th>
                <td>{formatPlainDate(r.sittingDate)}</td>
                <td>{r.band.label}</td>
                <td>
                  <Link to={paths.result.href(r.id)}>Read the report</Link>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
