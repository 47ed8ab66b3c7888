import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import {
  cellName,
  QUICK_FLAGS,
  QUICK_FLAG_LABELS,
  SLOT_OUTCOMES,
  TENSION_CAUTION,
  type CellValue,
  type DeskCriterion,
  type DeskRequest,
  type DeskView,
} from '@stavemark/shared';
import { MarkButtons } from './MarkButtons';
import { requestDetails, requestTitle, tempoText } from './request-text';
import type { SheetState } from './useSheet';

const OUTCOME_LABEL: Record<(typeof SLOT_OUTCOMES)[number], string> = {
  completed: 'Completed',
  incomplete: 'Incomplete',
  absent: 'Absent',
  withdrawn: 'Withdrawn',
};

/** Moves focus to the next (or previous) mark row or comment in the write-up. */
function moveFocus(from: HTMLElement, step: 1 | -1) {
  const all = Array.from(document.querySelectorAll<HTMLElement>('[data-desk-stop]'));
  const i = all.indexOf(from);
  all[i + step]?.focus();
}

function descriptorFor(c: DeskCriterion, mark: CellValue | undefined): string | null {
  if (typeof mark !== 'number') return null;
  return c.descriptors.find((d) => mark >= d.min && mark <= d.max)?.text ?? null;
}

/**
 * One criterion as a keyboard row: a digit sets the mark and moves on; arrows step it; Enter
 * moves on; Backspace clears. Tab goes through rows and comments in order.
 */
function MarkRow({
  request,
  criterion,
  sheet,
  disabled,
}: {
  request: DeskRequest;
  criterion: DeskCriterion;
  sheet: SheetState;
  disabled: boolean;
}) {
  const cell = cellName.mark(request.index, criterion.key);
  const value = sheet.values.get(cell);
  const set = (v: number | null) => !disabled && sheet.set(cell, v);
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    if (e.ctrlKey || e.metaKey || e.altKey) return;
    const current = typeof value === 'number' ? value : null;
    if (/^[0-9]$/.test(e.key)) {
      e.preventDefault();
      const d = Number(e.key);
      if (d <= criterion.maxMark) {
        set(d);
        moveFocus(e.currentTarget, 1);
      }
    } else if (e.key === 'ArrowRight' || e.key === 'ArrowUp') {
      e.preventDefault();
      set(Math.min((current ?? -1) + 1, criterion.maxMark));
    } else if (e.key === 'ArrowLeft' || e.key === 'ArrowDown') {
      e.preventDefault();
      set(Math.max((current ?? 1) - 1, 0));
    } else if (e.key === 'Enter') {
      e.preventDefault();
      moveFocus(e.currentTarget, e.shiftKey ? -1 : 1);
    } else if (e.key === 'Backspace' || e.key === 'Delete') {
      e.preventDefault();
      set(null);
    }
  };
  const descriptor = descriptorFor(criterion, value);
  return (
    <div
      className="sm-desk-row"
      role="group"
      tabIndex={disabled ? -1 : 0}
      data-desk-stop=""
      data-cell={cell}
      aria-label={`Request ${request.index + 1}, ${criterion.label}: ${typeof value === 'number' ? `${value} of ${criterion.maxMark}` : 'not marked'}`}
      onKeyDown={onKey}
    >
      <div className="sm-desk-row__head">
        <span className="sm-desk-row__label">{criterion.label}</span>
        <span className="sm-muted">out of {criterion.maxMark}</span>
      </div>
      <MarkButtons criterion={criterion} value={value} disabled={disabled} onSet={set} />
      <p className="sm-desk-row__descriptor">
        {descriptor ?? (
          <span className="sm-muted">{criterion.description ?? 'Type a digit to mark.'}</span>
        )}
      </p>
      <details className="sm-desk-row__levels">
        <summary>Level descriptors</summary>
        <ul>
          {criterion.descriptors.map((d) => (
            <li
              key={`${d.min}-${d.max}`}
              className={
                typeof value === 'number' && value >= d.min && value <= d.max
                  ? 'sm-desk-level--on'
                  : undefined
              }
            >
              <strong>{d.min === d.max ? d.min : `${d.min}–${d.max}`}</strong> {d.text}
            </li>
          ))}
        </ul>
      </details>
      {criterion.tension && (
        <p className="sm-health-caution" role="note">
          <strong>Health note.</strong> {TENSION_CAUTION}
        </p>
      )}
    </div>
  );
}

/** A comment saved when typing pauses and when the field is left, never per keystroke. */
function CommentField({
  cell,
  label,
  sheet,
  disabled,
}: {
  cell: string;
  label: string;
  sheet: SheetState;
  disabled: boolean;
}) {
  const stored = sheet.values.get(cell);
  const [text, setText] = useState(typeof stored === 'string' ? stored : '');
  const saved = useRef(text);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const flush = (value: string) => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    if (value !== saved.current) {
      saved.current = value;
      sheet.set(cell, value);
    }
  };
  // Text typed in the last moments must not wait for the pause: it is queued when the page is
  // hidden or reloaded, and when the field goes away (the examiner switches phase).
  const latest = useRef(text);
  const flushLatest = useRef(() => {});
  useEffect(() => {
    flushLatest.current = () => flush(latest.current);
  });
  useEffect(() => {
    const onHide = () => flushLatest.current();
    window.addEventListener('pagehide', onHide);
    return () => {
      window.removeEventListener('pagehide', onHide);
      flushLatest.current();
    };
  }, []);
  return (
    <label className="sm-desk-comment">
      <span>{label}</span>
      <textarea
        data-desk-stop=""
        data-cell={cell}
        rows={2}
        value={text}
        disabled={disabled}
        maxLength={2000}
        onChange={(e) => {
          const v = e.target.value;
          latest.current = v;
          setText(v);
          if (timer.current) clearTimeout(timer.current);
          timer.current = setTimeout(() => flush(v), 800);
        }}
        onBlur={() => flush(text)}
        onKeyDown={(e) => {
          // Enter moves on (as in the mark rows); Shift+Enter starts a new line.
          if (e.key === 'Enter' && !e.shiftKey) {
            e.preventDefault();
            flush(text);
            moveFocus(e.currentTarget, 1);
          }
        }}
      />
    </label>
  );
}

export function WriteUpPhase({ desk, sheet }: { desk: DeskView; sheet: SheetState }) {
  const ro = sheet.readOnly;
  const outcome = sheet.values.get(cellName.outcome());
  return (
    <div className="sm-desk-writeup">
      {desk.requests.map((r) => {
        const asked = sheet.values.get(cellName.asked(r.index)) !== false;
        const flags = QUICK_FLAGS.map(
          (f) => [f, sheet.values.get(cellName.flag(r.index, f))] as const,
        ).filter(([, v]) => typeof v === 'number' && v > 0);
        return (
          <section
            key={r.index}
            className={`sm-desk-card${asked ? '' : ' sm-desk-card--not-asked'}`}
            aria-labelledby={`req-${r.index}`}
          >
            <header className="sm-desk-card__head">
              <div>
                <h3 id={`req-${r.index}`}>
                  {r.index + 1}. {requestTitle(r)}
                </h3>
                <p className="sm-muted">
                  {requestDetails(r).join(' · ')} · {tempoText(r, desk.noteNames)}
                  {flags.length > 0 &&
                    ` · flags: ${flags.map(([f, v]) => `${QUICK_FLAG_LABELS[f].toLowerCase()} ×${String(v)}`).join(', ')}`}
                </p>
              </div>
              <label className="sm-desk-notasked">
                <input
                  type="checkbox"
                  checked={!asked}
                  disabled={ro}
                  onChange={(e) => sheet.set(cellName.asked(r.index), !e.target.checked)}
                />{' '}
                Not asked
              </label>
            </header>
            {asked && (
              <>
                {r.criteria.map((c) => (
                  <MarkRow key={c.key} request={r} criterion={c} sheet={sheet} disabled={ro} />
                ))}
                <CommentField
                  cell={cellName.comment(r.index)}
                  label={`Comment on request ${r.index + 1}`}
                  sheet={sheet}
                  disabled={ro}
                />
              </>
            )}
          </section>
        );
      })}
      <section className="sm-desk-card" aria-labelledby="overall">
        <h3 id="overall">Overall</h3>
        <CommentField
          cell={cellName.comment('overall')}
          label="Overall comment"
          sheet={sheet}
          disabled={ro}
        />
        <fieldset className="sm-desk-outcome">
          <legend>The slot’s outcome</legend>
          {SLOT_OUTCOMES.map((o) => (
            <label key={o}>
              <input
                type="radio"
                name="outcome"
                value={o}
                checked={outcome === o}
                disabled={ro}
                onChange={() => sheet.set(cellName.outcome(), o)}
              />{' '}
              {OUTCOME_LABEL[o]}
            </label>
          ))}
        </fieldset>
      </section>
    </div>
  );
}
