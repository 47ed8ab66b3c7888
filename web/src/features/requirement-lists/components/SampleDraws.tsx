import { useId, useState, type ReactNode } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import {
  DrawError,
  drawRequests,
  itemDurationSeconds,
  planSlotMinutes,
  type DrawResult,
  type NoteNameConvention,
  type RequirementLine,
  type SelectionRule,
} from '@stavemark/shared';
import { describeRequest, formatSeconds, tempoLabel } from './labels';

interface Props {
  /** Complete, valid lines (ids included) or null while the form still has problems. */
  lines: RequirementLine[] | null;
  rule: SelectionRule | null;
  convention: NoteNameConvention;
  initialSeed?: string;
}

function newSeed(): string {
  return Math.random().toString(36).slice(2, 8);
}

/**
 * What a candidate might be asked: the shared draw with a seed the teacher can change. The same
 * seed always gives the same requests, so a preview can be shown to a colleague.
 */
export function SampleDraws({ lines, rule, convention, initialSeed = 'preview' }: Props) {
  const id = useId();
  const [seed, setSeed] = useState(initialSeed);
  // Computed first, rendered after: the draw may refuse (a rule the lines cannot honour).
  type Outcome =
    | { kind: 'incomplete' }
    | { kind: 'refused'; message: string }
    | { kind: 'drawn'; draw: DrawResult; total: number; slot: number };
  let outcome: Outcome;
  if (!lines || !rule) outcome = { kind: 'incomplete' };
  else {
    try {
      const draw = drawRequests({ lines }, rule, seed);
      const total = draw.requests.reduce((sum, r) => sum + itemDurationSeconds(r), 0);
      outcome = {
        kind: 'drawn',
        draw,
        total,
        slot: planSlotMinutes({ lines, selectionRule: rule }),
      };
    } catch (err) {
      outcome = {
        kind: 'refused',
        message:
          err instanceof DrawError || err instanceof RangeError
            ? err.message
            : 'These lines cannot be drawn from yet.',
      };
    }
  }
  let body: ReactNode;
  if (outcome.kind === 'incomplete')
    body = (
      <p className="sm-muted">Complete the lines and the selection rule to see sample draws.</p>
    );
  else if (outcome.kind === 'refused') body = <p className="sm-field-error">{outcome.message}</p>;
  else {
    const { draw, total, slot } = outcome;
    body = (
      <>
        <table className="sm-table" aria-label="Sample draw">
          <thead>
            <tr>
              <th scope="col" className="sm-num">
                #
              </th>
              <th scope="col">Request</th>
              <th scope="col">Tempo</th>
              <th scope="col" className="sm-num">
                Playing time
              </th>
            </tr>
          </thead>
          <tbody>
            {draw.requests.map((r) => (
              <tr key={r.index}>
                <td className="sm-num">{r.index + 1}</td>
                <td>{describeRequest(r)}</td>
                <td>{tempoLabel(r.tempo, convention)}</td>
                <td className="sm-num">{formatSeconds(itemDurationSeconds(r))}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr>
              <th scope="row" colSpan={3}>
                Playing time of this draw
              </th>
              <td className="sm-num">{formatSeconds(total)}</td>
            </tr>
          </tfoot>
        </table>
        <p className="sm-field-hint">
          Suggested slot for this list: {slot} minutes (the slowest plausible draw, time to ask and
          settle each request, and a greeting; the write-up gap is added when a sitting is planned).
        </p>
      </>
    );
  }
  return (
    <section className="sm-sheet" aria-labelledby={`${id}-title`}>
      <h2 id={`${id}-title`}>Sample draws</h2>
      <div className="sm-toolbar">
        <div className="sm-field">
          <label htmlFor={`${id}-seed`}>Seed</label>
          <InputText
            id={`${id}-seed`}
            value={seed}
            onChange={(e) => setSeed(e.target.value)}
            aria-describedby={`${id}-seed-hint`}
          />
        </div>
        <Button
          type="button"
          icon="pi pi-refresh"
          label="Another draw"
          severity="secondary"
          onClick={() => setSeed(newSeed())}
        />
        <small id={`${id}-seed-hint`} className="sm-field-hint sm-toolbar-note">
          The same seed always gives the same requests.
        </small>
      </div>
      {body}
    </section>
  );
}
