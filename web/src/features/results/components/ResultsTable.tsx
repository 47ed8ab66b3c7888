import { useMemo, useState } from 'react';
import { DataTable, type DataTableFilterMeta } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Dropdown } from 'primereact/dropdown';
import { InputText } from 'primereact/inputtext';
import { FilterMatchMode } from 'primereact/api';
import type { ResultRow } from '@stavemark/shared';
import { formatPlainDate, LOCALE } from '@/lib/format';
import { DownloadButton } from './DownloadButton';

interface FlatRow {
  id: string;
  name: string;
  pupilNumber: string;
  sitting: string;
  sittingDate: string;
  listName: string;
  total: number;
  outOf: number;
  percentage: number;
  bandKey: string;
  bandLabel: string;
  basis: string;
  examiner: string;
  released: string;
}

const BASIS: Record<string, string> = { single: 'One examiner', first: 'First marker', agreed: 'Agreed', third: 'Third marker' };
const pct = (x: number) => `${new Intl.NumberFormat(LOCALE, { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(x)}\u00a0%`;

/**
 * Results as a table: sort by any column, search names and pupil numbers, filter by band, page
 * through 25 at a time; each row downloads its mark sheet and take-home report.
 */
export function ResultsTable({
  rows,
  bands,
  showSitting,
  label,
  canTakeHome,
}: {
  rows: ResultRow[];
  bands: { key: string; label: string }[];
  showSitting: boolean;
  label: string;
  canTakeHome: boolean;
}) {
  const flat = useMemo<FlatRow[]>(
    () =>
      rows.map((r) => ({
        id: r.resultId,
        name: r.student.name,
        pupilNumber: r.student.pupilNumber,
        sitting: r.sittingTitle,
        sittingDate: r.sittingDate,
        listName: r.listName,
        total: r.total,
        outOf: r.outOf,
        percentage: r.percentage,
        bandKey: r.band.key,
        bandLabel: r.band.label,
        basis: BASIS[r.basis] ?? r.basis,
        examiner: r.examiner ?? '',
        released: r.releasedAt ? formatPlainDate(r.releasedAt.slice(0, 10), 'short') : '',
      })),
    [rows],
  );
  const [filters, setFilters] = useState<DataTableFilterMeta>({
    global: { value: null, matchMode: FilterMatchMode.CONTAINS },
    bandKey: { value: null, matchMode: FilterMatchMode.EQUALS },
  });
  const setFilter = (key: 'global' | 'bandKey', value: string | null) =>
    setFilters((f) => ({ ...f, [key]: { ...(f[key] as object), value } as DataTableFilterMeta[string] }));
  const search = (filters.global as { value: string | null }).value ?? '';
  const band = (filters.bandKey as { value: string | null }).value;

  const header = (
    <div className="sm-table-filters">
      <span className="sm-field">
        <label htmlFor={`${label}-search`}>Search</label>
        <InputText id={`${label}-search`} value={search} placeholder="Name or pupil number" onChange={(e) => setFilter('global', e.target.value || null)} />
      </span>
      <span className="sm-field">
        <label htmlFor={`${label}-band`}>Band</label>
        <Dropdown
          inputId={`${label}-band`}
          value={band}
          options={bands.map((b) => ({ label: b.label, value: b.key }))}
          onChange={(e) => setFilter('bandKey', (e.value as string | null) ?? null)}
          placeholder="Every band"
          showClear
        />
      </span>
    </div>
  );

  return (
    <DataTable
      value={flat}
      dataKey="id"
      size="small"
      aria-label={label}
      header={header}
      filters={filters}
      globalFilterFields={['name', 'pupilNumber']}
      paginator
      rows={25}
      rowsPerPageOptions={[25, 50, 100]}
      sortMode="single"
      removableSort
      emptyMessage="No results to show."
      paginatorTemplate="FirstPageLink PrevPageLink CurrentPageReport NextPageLink LastPageLink RowsPerPageDropdown"
      currentPageReportTemplate="{first}–{last} of {totalRecords}"
    >
      <Column field="name" header="Student" sortable body={(r: FlatRow) => (<><span>{r.name}</span> <span className="sm-muted">{r.pupilNumber}</span></>)} />
      {showSitting && <Column field="sittingDate" header="Date" sortable body={(r: FlatRow) => formatPlainDate(r.sittingDate, 'short')} />}
      {showSitting && <Column field="sitting" header="Sitting" sortable />}
      {!showSitting && <Column field="listName" header="List" sortable />}
      <Column field="total" header="Total" sortable className="sm-num" body={(r: FlatRow) => `${r.total} / ${r.outOf}`} />
      <Column field="percentage" header="%" sortable className="sm-num" body={(r: FlatRow) => pct(r.percentage)} />
      <Column field="bandLabel" header="Band" sortable body={(r: FlatRow) => <span className={`sm-band sm-band-${r.bandKey}`}>{r.bandLabel}</span>} />
      <Column field="basis" header="Marks" sortable />
      {!showSitting && <Column field="examiner" header="Examiner" sortable />}
      <Column field="released" header="Released" sortable body={(r: FlatRow) => r.released || <span className="sm-muted">Not yet</span>} />
      <Column
        header="Print"
        body={(r: FlatRow) => (
          <div className="sm-row-downloads">
            <DownloadButton label="Mark sheet" icon="pi pi-file-pdf" path={`/results/${r.id}/mark-sheet`} fallbackName="mark-sheet.pdf" />
            {canTakeHome && <DownloadButton label="Take-home" icon="pi pi-home" path={`/results/${r.id}/take-home`} fallbackName="report.pdf" />}
          </div>
        )}
      />
    </DataTable>
  );
}
