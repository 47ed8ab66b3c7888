import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { ResultsPeriodQuery } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { formatPlainDate } from '@/lib/format';
import { useClassResults } from '../api/get-class-results';
import { BandChart } from '../components/BandChart';
import { DownloadButton } from '../components/DownloadButton';
import { PeriodPicker } from '../components/PeriodPicker';
import { ResultsTable } from '../components/ResultsTable';
import { CriteriaTable, Figures, pct } from '../components/Summary';
import '../results.css';

export function ClassResultsPage() {
  const { classId = '' } = useParams();
  const [period, setPeriod] = useState<ResultsPeriodQuery>({});
  const view = useClassResults(classId, period);
  if (view.isPending) return <PageLoading />;
  if (view.isError) return <ErrorMessage error={view.error} what="the results of this class" />;
  const v = view.data;
  const query = { from: v.period.from, to: v.period.to };
  return (
    <section aria-labelledby="class-results-title" className="sm-results">
      <div className="sm-page-header">
        <div>
          <p className="sm-breadcrumb">
            <Link to={paths.results.href()}>Results</Link> · <Link to={paths.classDetail.href(v.class.id)}>The class</Link>
          </p>
          <h1 id="class-results-title">Results: {v.class.name}</h1>
          <p className="sm-page-subtitle">
            {v.class.code} · {v.class.students} students · {formatPlainDate(v.period.from, 'short')} to {formatPlainDate(v.period.to, 'short')}
          </p>
        </div>
        <div className="sm-row-actions">
          <DownloadButton csv label="Year of marks (CSV)" icon="pi pi-download" path={`/classes/${v.class.id}/results/export`} query={{ ...query, bom: true }} fallbackName="marks.csv" />
          <DownloadButton label="Class summary (PDF)" icon="pi pi-file-pdf" path={`/classes/${v.class.id}/results/summary`} query={query} fallbackName="class-summary.pdf" />
        </div>
      </div>
      <PeriodPicker value={period} onChange={setPeriod} shown={v.period} />
      <Figures summary={v.summary} extra={[['Sittings', String(v.sittings.length)]]} />
      <div className="sm-sheet">
        <h2>Bands over the period</h2>
        <BandChart id="class-bands" bands={v.summary.bands} title={`Bands of ${v.class.name}, all sittings in the period`} />
      </div>
      <div className="sm-sheet">
        <h2>Sittings</h2>
        <table className="sm-table" aria-label="Sittings of the class">
          <thead>
            <tr>
              <th scope="col">Date</th>
              <th scope="col">Sitting</th>
              <th scope="col" className="sm-num">Results</th>
              <th scope="col" className="sm-num">Mean</th>
              <th scope="col" className="sm-num">Median</th>
              {v.summary.bands.map((b) => (
                <th key={b.key} scope="col" className="sm-num">{b.label}</th>
              ))}
            </tr>
          </thead>
          <tbody>
            {v.sittings.length === 0 && (
              <tr>
                <td colSpan={5 + v.summary.bands.length} className="sm-muted">No results in this period.</td>
              </tr>
            )}
            {v.sittings.map((s) => (
              <tr key={s.sittingId}>
                <td>{formatPlainDate(s.date, 'short')}</td>
                <td><Link to={paths.sittingResults.href(s.sittingId)}>{s.title}</Link></td>
                <td className="sm-num">{s.results}</td>
                <td className="sm-num">{pct(s.meanPercent)}</td>
                <td className="sm-num">{pct(s.medianPercent)}</td>
                {s.bands.map((b) => (
                  <td key={b.key} className="sm-num">{b.count}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="sm-sheet">
        <h2>Students</h2>
        <ResultsTable rows={v.results} bands={v.summary.bands} showSitting label="Results of the class" canTakeHome />
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
