import { useState } from 'react';
import { Link } from 'react-router-dom';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import type { ClassComparisonRow, ResultsPeriodQuery, SittingSummary } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { useClassComparison } from '../api/get-class-comparison';
import { useClosedSittings } from '../api/get-closed-sittings';
import { DownloadButton } from '../components/DownloadButton';
import { PeriodPicker } from '../components/PeriodPicker';
import { pct } from '../components/Summary';
import '../results.css';

/** Each band as a thin bar with its count: the length carries the share, the words the band. */
function BandBars({ row }: { row: ClassComparisonRow }) {
  if (row.results === 0) return <span className="sm-muted">No results</span>;
  return (
    <div className="sm-compare-bands">
      {row.bands.map((b) => (
        <div key={b.key} className="sm-compare-band">
          <span>{b.label}</span>
          <span className="sm-compare-bar" aria-hidden="true">
            <span style={{ width: `${b.percent}%` }} />
          </span>
          <span className="sm-num">{b.count}</span>
        </div>
      ))}
    </div>
  );
}

export function ResultsPage() {
  const roles = activeMembership(useCurrentUser())?.roles ?? [];
  const [period, setPeriod] = useState<ResultsPeriodQuery>({});
  const comparison = useClassComparison(period);
  const sittings = useClosedSittings();
  const shown = comparison.data?.period;
  return (
    <section aria-labelledby="results-title" className="sm-results">
      <div className="sm-page-header">
        <div>
          <h1 id="results-title">Results</h1>
          <p className="sm-page-subtitle">
            {roles.includes('admin') ? 'Every class side by side' : 'Your classes side by side'}
            {shown ? `, ${formatPlainDate(shown.from, 'short')} to ${formatPlainDate(shown.to, 'short')}` : ''}.
          </p>
        </div>
        {roles.includes('admin') && shown && (
          <div className="sm-row-actions">
            <DownloadButton csv label="Whole school (CSV)" icon="pi pi-download" path="/results/export" query={{ from: shown.from, to: shown.to, bom: true }} fallbackName="marks.csv" />
          </div>
        )}
      </div>
      <PeriodPicker value={period} onChange={setPeriod} {...(shown ? { shown } : {})} />
      {comparison.isError && <ErrorMessage error={comparison.error} what="the class comparison" />}
      <div className="sm-sheet">
        <h2>Classes compared</h2>
        <DataTable
          value={comparison.data?.classes ?? []}
          dataKey="classId"
          size="small"
          aria-label="Classes compared"
          loading={comparison.isFetching}
          sortMode="single"
          removableSort
          paginator={(comparison.data?.classes.length ?? 0) > 25}
          rows={25}
          emptyMessage={comparison.isPending ? 'Loading…' : 'No classes yet.'}
        >
          <Column field="name" header="Class" sortable body={(r: ClassComparisonRow) => <Link to={paths.classResults.href(r.classId)}>{r.name}</Link>} />
          <Column field="code" header="Code" sortable />
          <Column field="students" header="Students" sortable className="sm-num" />
          <Column field="studentsWithResults" header="With results" sortable className="sm-num" />
          <Column field="results" header="Results" sortable className="sm-num" />
          <Column field="meanPercent" header="Mean" sortable className="sm-num" body={(r: ClassComparisonRow) => pct(r.meanPercent)} />
          <Column field="medianPercent" header="Median" sortable className="sm-num" body={(r: ClassComparisonRow) => pct(r.medianPercent)} />
          <Column header="Bands" body={(r: ClassComparisonRow) => <BandBars row={r} />} />
        </DataTable>
      </div>
      <div className="sm-sheet">
        <h2>Sittings with results</h2>
        {sittings.isError && <ErrorMessage error={sittings.error} what="the sittings" />}
        <DataTable value={sittings.data ?? []} dataKey="id" size="small" aria-label="Sittings with results" paginator={(sittings.data?.length ?? 0) > 10} rows={10} emptyMessage={sittings.isPending ? 'Loading…' : 'No sitting has closed its marking yet.'}>
          <Column field="date" header="Date" sortable body={(s: SittingSummary) => formatPlainDate(s.date, 'short')} />
          <Column field="title" header="Sitting" sortable body={(s: SittingSummary) => <Link to={paths.sittingResults.href(s.id)}>{s.title}</Link>} />
          <Column field="room" header="Room" />
          <Column field="candidateCount" header="Candidates" className="sm-num" />
          <Column header="Status" body={(s: SittingSummary) => (s.status === 'published' ? 'Published' : 'Marking closed')} />
        </DataTable>
      </div>
    </section>
  );
}
