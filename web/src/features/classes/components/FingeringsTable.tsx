import { useState } from 'react';
import { DataTable, type DataTableExpandedRows } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { formatFingering, type CurrentFingering, type FingeringView } from '@stavemark/shared';
import { HANDS_LABELS } from '@/components/music-labels';
import { formatDateInZone } from '@/lib/format';
import { fingeringTitle, spanLabel } from './fingering-labels';

interface Props {
  fingerings: CurrentFingering[];
  timeZone: string;
  loading: boolean;
  /** Given when the caller may change fingerings: opens the form for this one. */
  onReplace?: (f: CurrentFingering) => void;
}

const describe = (f: FingeringView) => `${fingeringTitle(f)}, ${HANDS_LABELS[f.hand]}`;

function setLine(f: FingeringView, timeZone: string): string {
  const when = formatDateInZone(f.setAt, timeZone);
  return f.setBy ? `${f.setBy.displayName}, ${when}` : when;
}

/** The current fingering per kind, key, mode, hand and inversion; earlier ones open below. */
export function FingeringsTable({ fingerings, timeZone, loading, onReplace }: Props) {
  const [expanded, setExpanded] = useState<DataTableExpandedRows>({});
  const toggle = (f: CurrentFingering) =>
    setExpanded((e) => {
      const next = { ...e };
      if (next[f.id]) delete next[f.id];
      else next[f.id] = true;
      return next;
    });

  const history = (f: CurrentFingering) => (
    <table
      className="sm-table sm-fingering-history"
      aria-label={`Earlier fingerings: ${describe(f)}`}
    >
      <thead>
        <tr>
          <th scope="col">Revision</th>
          <th scope="col">Span</th>
          <th scope="col">Fingering</th>
          <th scope="col">Set by</th>
          <th scope="col">Note</th>
        </tr>
      </thead>
      <tbody>
        {f.history.map((h) => (
          <tr key={h.id}>
            <td>{h.revision}</td>
            <td>{spanLabel(h)}</td>
            <td>
              <code className="sm-digits">{formatFingering(h.digits)}</code>
            </td>
            <td>{setLine(h, timeZone)}</td>
            <td>{h.note ?? <span className="sm-muted">—</span>}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );

  return (
    <div className="sm-table-wrap">
      <DataTable
        value={fingerings}
        dataKey="id"
        size="small"
        loading={loading}
        expandedRows={expanded}
        rowExpansionTemplate={history}
        pt={{ table: { 'aria-label': 'Approved fingerings' } }}
        emptyMessage={loading ? 'Loading…' : 'No approved fingering recorded yet.'}
      >
        <Column
          header="For"
          body={(f: CurrentFingering) => (
            <span className="sm-cell-stack">
              <strong>{fingeringTitle(f)}</strong>
              {f.note && <small className="sm-muted">{f.note}</small>}
            </span>
          )}
        />
        <Column header="Hand" body={(f: CurrentFingering) => HANDS_LABELS[f.hand]} />
        <Column header="Span" body={(f: CurrentFingering) => spanLabel(f)} />
        <Column
          header="Fingering"
          body={(f: CurrentFingering) => (
            <code className="sm-digits">{formatFingering(f.digits)}</code>
          )}
        />
        <Column
          header="Set by"
          body={(f: CurrentFingering) => (
            <span className="sm-cell-stack">
              <span>{setLine(f, timeZone)}</span>
              <small className="sm-muted">Revision {f.revision}</small>
            </span>
          )}
        />
        <Column
          header={<span className="sm-visually-hidden">Actions</span>}
          body={(f: CurrentFingering) => (
            <span className="sm-row-actions">
              {f.history.length > 0 && (
                <Button
                  type="button"
                  size="small"
                  text
                  label={expanded[f.id] ? 'Hide earlier' : `${f.history.length} earlier`}
                  icon={expanded[f.id] ? 'pi pi-chevron-up' : 'pi pi-chevron-down'}
                  aria-expanded={!!expanded[f.id]}
                  aria-label={`${expanded[f.id] ? 'Hide' : 'Show'} earlier fingerings: ${describe(f)}`}
                  onClick={() => toggle(f)}
                />
              )}
              {onReplace && (
                <Button
                  type="button"
                  size="small"
                  severity="secondary"
                  label="Replace"
                  aria-label={`Replace the fingering: ${describe(f)}`}
                  onClick={() => onReplace(f)}
                />
              )}
            </span>
          )}
        />
      </DataTable>
    </div>
  );
}
