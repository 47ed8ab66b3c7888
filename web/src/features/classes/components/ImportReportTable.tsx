import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Tag } from 'primereact/tag';
import type { ImportReport, ImportRowReport, ImportRowStatus } from '@stavemark/shared';

const STATUS: Record<
  ImportRowStatus,
  { label: string; severity: 'success' | 'info' | 'secondary' | 'danger' }
> = {
  new: { label: 'New', severity: 'success' },
  updated: { label: 'Updated', severity: 'info' },
  unchanged: { label: 'Unchanged', severity: 'secondary' },
  error: { label: 'Error', severity: 'danger' },
};

export function statusTag(status: ImportRowStatus) {
  return <Tag severity={STATUS[status].severity} value={STATUS[status].label} />;
}

/** The counts in words, e.g. "5 new, 1 updated, 0 unchanged, 1 with an error". */
export function countsText(counts: ImportReport['counts']): string {
  return `${counts.new} new, ${counts.updated} updated, ${counts.unchanged} unchanged, ${counts.error} with ${counts.error === 1 ? 'an error' : 'errors'}`;
}

/** Every row of a dry run or a refused import: line, outcome and what changes or what is wrong. */
export function ImportReportTable({ report }: { report: ImportReport }) {
  // Rows with errors first, so a long file does not hide them.
  const rows = [...report.rows].sort(
    (a, b) => Number(b.status === 'error') - Number(a.status === 'error') || a.line - b.line,
  );
  const details = (row: ImportRowReport) =>
    row.status === 'error' ? (
      <ul className="sm-row-problems">
        {row.errors.map((e) => (
          <li key={e}>{e}</li>
        ))}
      </ul>
    ) : row.changes.length ? (
      <ul className="sm-row-changes">
        {row.changes.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    ) : row.status === 'new' ? (
      <span className="sm-muted">A new student</span>
    ) : (
      <span className="sm-muted">Nothing to change</span>
    );
  return (
    <div className="sm-table-wrap">
      <DataTable
        value={rows}
        dataKey="line"
        size="small"
        aria-label="Rows of the file"
        paginator={rows.length > 50}
        rows={50}
        rowClassName={(r: ImportRowReport) => (r.status === 'error' ? 'sm-row-error' : '')}
      >
        <Column field="line" header="Line" style={{ width: '4.5rem' }} />
        <Column
          header="Outcome"
          body={(r: ImportRowReport) => statusTag(r.status)}
          style={{ width: '7.5rem' }}
        />
        <Column field="pupilNumber" header="Pupil number" />
        <Column field="name" header="Name" />
        <Column field="classCode" header="Class" />
        <Column header="Details" body={details} />
      </DataTable>
    </div>
  );
}
