import { useEffect } from 'react';
import {
  cellName,
  formatFingering,
  QUICK_FLAGS,
  QUICK_FLAG_LABELS,
  type DeskRequest,
  type DeskView,
  type QuickFlag,
} from '@stavemark/shared';
import { requestDetails, requestTitle, tempoText } from './request-text';
import { ChangeRequestForm } from './ChangeRequestForm';
import { MarkButtons } from './MarkButtons';
import type { SheetState } from './useSheet';

/** One key per quick flag; arrows move between requests (shown on the buttons). */
export const FLAG_KEYS: Record<QuickFlag, string> = {
  slip: 'f',
  restart: 'r',
  stopped: 's',
  prompted: 'p',
};

const isTyping = (t: EventTarget | null) =>
  t instanceof HTMLElement &&
  (t.tagName === 'INPUT' ||
    t.tagName === 'TEXTAREA' ||
    t.tagName === 'SELECT' ||
    t.isContentEditable);

export function PlayingPhase({
  desk,
  sheet,
  current,
  setCurrent,
  onWriteUp,
}: {
  desk: DeskView;
  sheet: SheetState;
  current: number;
  setCurrent: (i: number) => void;
  onWriteUp: () => void;
}) {
  const requests = desk.requests;
  const r = requests[current];
  const count = (req: DeskRequest, flag: QuickFlag) => {
    const v = sheet.values.get(cellName.flag(req.index, flag));
    return typeof v === 'number' ? v : 0;
  };

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (isTyping(e.target) || e.ctrlKey || e.metaKey || e.altKey || !r) return;
      const key = e.key.toLowerCase();
      const flag = (Object.entries(FLAG_KEYS) as [QuickFlag, string][]).find(
        ([, k]) => k === key,
      )?.[0];
      if (flag && !sheet.readOnly) {
        e.preventDefault();
        sheet.set(cellName.flag(r.index, flag), count(r, flag) + 1);
      } else if (e.key === 'ArrowRight' || e.key === 'PageDown') {
        e.preventDefault();
        setCurrent(Math.min(current + 1, requests.length - 1));
      } else if (e.key === 'ArrowLeft' || e.key === 'PageUp') {
        e.preventDefault();
        setCurrent(Math.max(current - 1, 0));
      } else if (key === 'w') {
        e.preventDefault();
        onWriteUp();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  });

  if (!r) return <p>No requests were drawn.</p>;
  return (
    <div className="sm-desk-playing">
      <nav className="sm-desk-steps" aria-label="Requests">
        {requests.map((q, i) => (
          <button
            key={q.index}
            type="button"
            className={`sm-desk-step${i === current ? ' sm-desk-step--current' : ''}`}
            aria-current={i === current ? 'step' : undefined}
            onClick={() => setCurrent(i)}
          >
            {i + 1}
          </button>
        ))}
      </nav>

      <article className="sm-desk-request" aria-labelledby="current-request">
        <p className="sm-desk-request__count">
          Request {current + 1} of {requests.length}
          {r.substitution && (
            <span className="sm-desk-badge">
              adjusted: {r.substitution.types.join(', ').replaceAll('_', ' ')}
            </span>
          )}
        </p>
        <h2 id="current-request" className="sm-desk-request__title">
          {requestTitle(r)}
        </h2>
        <p className="sm-desk-request__details">{requestDetails(r).join(' · ')}</p>
        <p className="sm-desk-request__tempo">
          <span className="sm-muted">Tempo</span> {tempoText(r, desk.noteNames)}
        </p>
        <div className="sm-desk-fingering">
          <span className="sm-muted">Approved fingering</span>
          {r.fingerings.length === 0 ? (
            <span> none on record</span>
          ) : (
            r.fingerings.map((f) => (
              <span key={f.id} className="sm-desk-fingering__hand">
                <strong>{f.hand}</strong> {formatFingering(f.digits)}
              </span>
            ))
          )}
        </div>
      </article>

      <div className="sm-desk-flags" role="group" aria-label="Quick flags">
        {QUICK_FLAGS.map((flag) => (
          <button
            key={flag}
            type="button"
            className="sm-desk-flag"
            disabled={sheet.readOnly}
            onClick={() => sheet.set(cellName.flag(r.index, flag), count(r, flag) + 1)}
            aria-label={`${QUICK_FLAG_LABELS[flag]} (key ${FLAG_KEYS[flag].toUpperCase()}), ${count(r, flag)} so far`}
          >
            <kbd>{FLAG_KEYS[flag].toUpperCase()}</kbd>
            <span className="sm-desk-flag__label">{QUICK_FLAG_LABELS[flag]}</span>
            <span className="sm-desk-flag__count" data-testid={`count-${flag}`}>
              {count(r, flag)}
            </span>
          </button>
        ))}
      </div>

      <details className="sm-desk-quickmarks">
        <summary>Mark now (optional)</summary>
        {r.criteria.map((c) => (
          <div key={c.key} className="sm-desk-quickmark">
            <span>{c.label}</span>
            <MarkButtons
              criterion={c}
              value={sheet.values.get(cellName.mark(r.index, c.key))}
              disabled={sheet.readOnly}
              onSet={(v) => sheet.set(cellName.mark(r.index, c.key), v)}
            />
          </div>
        ))}
      </details>

      <ChangeRequestForm
        key={`${r.index}-${r.change?.at ?? ''}`}
        slotId={desk.slot.id}
        request={r}
        disabled={sheet.readOnly}
      />

      <div className="sm-desk-actions">
        <button
          type="button"
          className="sm-desk-nav"
          onClick={() => setCurrent(Math.max(current - 1, 0))}
          disabled={current === 0}
        >
          ← Previous
        </button>
        <button
          type="button"
          className="sm-desk-nav"
          onClick={() => setCurrent(Math.min(current + 1, requests.length - 1))}
          disabled={current === requests.length - 1}
        >
          Next →
        </button>
        <button type="button" className="sm-desk-primary" onClick={onWriteUp}>
          Candidate has left: write up (W)
        </button>
      </div>
    </div>
  );
}
