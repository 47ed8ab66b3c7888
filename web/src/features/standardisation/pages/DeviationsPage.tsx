import { lazy, Suspense } from 'react';
import { Link } from 'react-router-dom';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { paths } from '@/config/paths';
import { formatPlainDate } from '@/lib/format';
import { signed } from '@/lib/stats-format';
import { useDeviations } from '../api/get-deviations';
import '../standardisation.css';

const DeviationChart = lazy(() => import('../components/DeviationChart').then((m) => ({ default: m.DeviationChart })));

/** The examiner's own deviation from reference marks, exercise by exercise and per criterion. */
export function DeviationsPage() {
  const history = useDeviations();
  return (
    <section aria-labelledby="dev-title">
      <p className="sm-breadcrumb">
        <Link to={paths.standardisation.href()}>Standardisation</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="dev-title">My deviation over time</h1>
          <p className="sm-page-subtitle">How far your marks were from the reference marks in each exercise you submitted, in percentage points of each criterion’s maximum.</p>
        </div>
      </div>
      {history.isPending && <PageLoading />}
      {history.isError && <ErrorMessage error={history.error} what="your deviations" />}
      {history.data && history.data.points.length === 0 && <p className="sm-muted">You have not submitted a standardisation exercise yet.</p>}
      {history.data && history.data.points.length > 0 && (
        <div className="sm-std-page">
          <section className="sm-sheet" aria-labelledby="dev-exercises">
            <h2 id="dev-exercises">Exercise by exercise</h2>
            <div className="sm-std-split">
              <Suspense fallback={<p className="sm-muted">Drawing the chart…</p>}>
                <DeviationChart points={history.data.points} />
              </Suspense>
              <table className="sm-table" aria-label="Deviation per exercise">
                <thead>
                  <tr>
                    <th scope="col">Submitted</th>
                    <th scope="col">Exercise</th>
                    <th scope="col" className="sm-num">
                      Mean distance
                    </th>
                    <th scope="col" className="sm-num">
                      Mean difference
                    </th>
                    <th scope="col" className="sm-num">
                      Exact
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {history.data.points.map((p) => (
                    <tr key={p.exerciseId}>
                      <td>{formatPlainDate(p.submittedAt.slice(0, 10), 'short')}</td>
                      <td>
                        <Link to={paths.standardisationExercise.href(p.exerciseId)}>{p.title}</Link>
                      </td>
                      <td className="sm-num">{p.meanAbsoluteDifferencePercent.toFixed(1)}</td>
                      <td className="sm-num">{signed(p.meanDifferencePercent, 1)}</td>
                      <td className="sm-num">
                        {Math.round(p.exactShare * p.cells)} of {p.cells}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </section>
          <section className="sm-sheet" aria-labelledby="dev-criteria">
            <h2 id="dev-criteria">Per criterion, over every exercise</h2>
            <table className="sm-table">
              <thead>
                <tr>
                  <th scope="col">Criterion</th>
                  <th scope="col" className="sm-num">
                    Marks compared
                  </th>
                  <th scope="col" className="sm-num">
                    Mean difference (marks)
                  </th>
                  <th scope="col" className="sm-num">
                    Mean distance (marks)
                  </th>
                </tr>
              </thead>
              <tbody>
                {history.data.criteria.map((c) => (
                  <tr key={c.criterion}>
                    <th scope="row">
                      {c.label} <span className="sm-muted">(out of {c.maxMark})</span>
                    </th>
                    <td className="sm-num">{c.n}</td>
                    <td className="sm-num">{signed(c.meanDifference, 2)}</td>
                    <td className="sm-num">{c.meanAbsoluteDifference.toFixed(2)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        </div>
      )}
    </section>
  );
}
