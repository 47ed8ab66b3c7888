import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import {
  displayNoteName,
  isCountedKind,
  type NoteNameConvention,
  type RequirementLineView,
} from '@stavemark/shared';
import {
  DIRECTION_LABELS,
  formatSeconds,
  HANDS_LABELS,
  INVERSION_LABELS,
  KIND_LABELS,
  lineFigures,
  MODE_LABELS,
  MOTION_LABELS,
  tempoLabel,
} from './labels';

function range(values: number[], format: (n: number) => string): string {
  if (values.length === 0) return '—';
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  return lo === hi ? format(lo) : `${format(lo)} – ${format(hi)}`;
}

/** A version's lines with their computed note counts and timing, read-only. */
export function LinesTable({
  lines,
  convention,
}: {
  lines: RequirementLineView[];
  convention: NoteNameConvention;
}) {
  const rows = lines.map((l, i) => ({ line: l, n: i + 1, figures: lineFigures(l) }));
  type Row = (typeof rows)[number];
  const what = ({ line }: Row) => {
    const modes =
      line.modes.length > 0 ? `, ${line.modes.map((m) => MODE_LABELS[m]).join(' or ')}` : '';
    return (
      <span className="sm-cell-stack">
        <strong>{line.label || `${KIND_LABELS[line.kind]}${modes}`}</strong>
        {isCountedKind(line.kind) ? (
          <small>
            {line.label && `${KIND_LABELS[line.kind]}${modes}: `}
            {line.keys.map(displayNoteName).join(', ')}
            {line.inversions.length > 0 &&
              ` (${line.inversions.map((i) => INVERSION_LABELS[i]).join(' or ')})`}
          </small>
        ) : (
          <small>{(line.titles ?? []).join('; ')}</small>
        )}
      </span>
    );
  };
  const hands = ({ line }: Row) => (
    <span className="sm-cell-stack">
      <span>{line.hands.map((h) => HANDS_LABELS[h]).join(' or ')}</span>
      {line.motions.length > 0 && (
        <small>{line.motions.map((m) => MOTION_LABELS[m]).join(' or ')}</small>
      )}
    </span>
  );
  const span = ({ line }: Row) =>
    isCountedKind(line.kind) ? (
      <span className="sm-cell-stack">
        <span>{line.octaves.join(' or ')} oct.</span>
        <small>
          {(line.directions && line.directions.length > 0
            ? line.directions
            : (['up_down'] as const)
          )
            .map((d) => DIRECTION_LABELS[d])
            .join(' or ')}
        </small>
      </span>
    ) : (
      '—'
    );
  return (
    <div className="sm-table-wrap">
      <DataTable
        value={rows}
        dataKey="n"
        size="small"
        pt={{ table: { 'aria-label': 'Lines' } }}
        stripedRows
      >
        <Column field="n" header="#" className="sm-num" headerClassName="sm-num" />
        <Column header="What may be asked" body={what} />
        <Column header="Hands" body={hands} />
        <Column header="Span" body={span} />
        <Column header="Tempo" body={({ line }: Row) => tempoLabel(line.tempo, convention)} />
        <Column
          header="Notes"
          className="sm-num"
          headerClassName="sm-num"
          body={({ figures }: Row) =>
            range(
              figures.spans.flatMap((s) => (s.notes === null ? [] : [s.notes])),
              String,
            )
          }
        />
        <Column
          header="Notes / s"
          className="sm-num"
          headerClassName="sm-num"
          body={({ figures, line }: Row) =>
            isCountedKind(line.kind) && figures.notesPerSecond !== null
              ? figures.notesPerSecond.toFixed(2)
              : '—'
          }
        />
        <Column
          header="Duration"
          className="sm-num"
          headerClassName="sm-num"
          body={({ figures }: Row) =>
            range(
              figures.spans.map((s) => s.seconds),
              formatSeconds,
            )
          }
        />
        <Column
          header="Marked with"
          body={({ line }: Row) =>
            `${line.rubric.name} v${line.rubric.version}${line.rubric.status === 'draft' ? ' (draft)' : ''}`
          }
        />
        <Column
          header="Weight"
          field="line.difficultyWeight"
          className="sm-num"
          headerClassName="sm-num"
        />
      </DataTable>
    </div>
  );
}
