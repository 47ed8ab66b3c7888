import type { Direction } from '@stavemark/shared';
import { DIRECTION_LABELS, formatSeconds, octavesLabel, type LineFigures } from './labels';

/** The live figures of one line: notes, notes per second and playing time per span. */
export function LineFiguresView({ figures, label }: { figures: LineFigures; label: string }) {
  if (figures.problem) return <p className="sm-muted sm-line-figures">{figures.problem}</p>;
  const nps = figures.notesPerSecond;
  return (
    <div className="sm-line-figures" aria-live="polite">
      <table className="sm-table" aria-label={`Timing of ${label}`}>
        <thead>
          <tr>
            <th scope="col">Span</th>
            <th scope="col" className="sm-num">
              Notes
            </th>
            <th scope="col" className="sm-num">
              Notes per second
            </th>
            <th scope="col" className="sm-num">
              Duration
            </th>
          </tr>
        </thead>
        <tbody>
          {figures.spans.map((s) => (
            <tr key={`${s.octaves}-${s.direction}`}>
              <td>
                {s.notes === null
                  ? 'Stated playing time'
                  : `${octavesLabel(s.octaves)}, ${DIRECTION_LABELS[s.direction as Direction]}`}
              </td>
              <td className="sm-num">{s.notes ?? '—'}</td>
              <td className="sm-num">{s.notes === null || nps === null ? '—' : nps.toFixed(2)}</td>
              <td className="sm-num">{formatSeconds(s.seconds)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
