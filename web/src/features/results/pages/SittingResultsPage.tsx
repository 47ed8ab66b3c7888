import { Link, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { useSittingResults } from '../api/get-sitting-results';
import { BandChart } from '../components/BandChart';
import { CriteriaTable, Figures } from '../components/Summary';
import { DownloadButton } from '../components/DownloadButton';
import { ResultsTable } from '../components/ResultsTable';
import '../results.css';

const SCOPE: Record<string, string> = {
  all: 'Every candidate of the sitting.',
  own_pupils: 'Your own pupils in this sitting.',
  marked: 'The candidates you marked.',
};
const OUTCOME: Record<string, string> = { absent: 'Absent', withdrawn: 'Withdrawn', incomplete: 'Incomplete', completed: 'Completed, result not yet computed' };

export function SittingResultsPage() {
  const { sittingId = '' } = useParams();
  const view = useSittingResults(sittingId);
  const roles = activeMembership(useCurrentUser())?.roles ?? [];
  if (view.isPending) return <PageLoading />;
  if (view.isError) return <ErrorMessage error={view.error} what="the results of this sitting" />;
  const v = view.data;
  const closed = v.sitting.status === 'marking_closed' || v.sitting.status === 'published';
  return (
    <section aria-labelledby="sitting-results-title" className="sm-results">
      <div className="sm-page-header">
        <div>
          <p className="sm-breadcrumb">
            <Link to={paths.results.href()}>Results</Link> · <Link to={paths.sitting.href(v.sitting.id)}>The sitting</Link>
          </p>
          <h1 id="sitting-results-title">Results: {v.sitting.title}</h1>
          <p className="sm-page-subtitle">
            {formatPlainDate(v.sitting.date)} · {v.sitting.room} · {SCOPE[v.scope]}
          </p>
        </div>
        <div className="sm-row-actions">
          <DownloadButton csv label="CSV" icon="pi pi-download" path={`/sittings/${v.sitting.id}/results/export`} query={{ bom: true }} fallbackName="results.csv" />
        </div>
      </div>
      {!closed && (
        <p className="sm-note" role="note">
          Results appear when marking closes. This sitting is still {v.sitting.status.replace('_', ' ')}.
        </p>
      )}
      <Figures summary={v.summary} extra={[['Without a result', String(v.withoutResult.length)]]} />
      <div className="sm-sheet">
        <h2>Bands</h2>
        <BandChart id="sitting-bands" bands={v.summary.bands} title={`Bands in ${v.sitting.title}`} />
      </div>
      <div className="sm-sheet">
        <h2>Candidates</h2>
        <ResultsTable rows={v.results} bands={v.summary.bands} showSitting={false} label="Results of the sitting" canTakeHome={roles.includes('admin') || roles.includes('teacher')} />
        {v.withoutResult.length > 0 && (
          <>
            <h3>Without a result</h3>
            <p className="sm-muted">Absent, withdrawn and incomplete slots get no result and stay out of every figure on this page.</p>
            <table className="sm-table" aria-label="Candidates without a result">
              <thead>
                <tr>
                  <th scope="col">Student</th>
                  <th scope="col">Pupil number</th>
                  <th scope="col">Outcome</th>
                </tr>
              </thead>
              <tbody>
                {v.withoutResult.map((w) => (
                  <tr key={w.slotId}>
                    <td>{w.student.name}</td>
                    <td>{w.student.pupilNumber}</td>
                    <td>{w.outcome ? OUTCOME[w.outcome] : 'Not recorded'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </>
        )}
      </div>
      {v.criteria.length > 0 && (
        <div className="sm-sheet">
          <h2>Criteria on average</h2>
          <CriteriaTable criteria={v.criteria} />
        </div>
      )}
    </section>
  );
}
