import type { KeyboardEvent } from 'react';
import { TENSION_CAUTION, type RubricCriterion } from '@stavemark/shared';

const TENSION = /tension|freedom/i;

function moveFocus(from: HTMLElement, step: 1 | -1) {
  const all = Array.from(document.querySelectorAll<HTMLElement>('[data-std-stop]'));
  all[all.indexOf(from) + step]?.focus();
}

/** One criterion as a keyboard row, like the desk: a digit marks and moves on, arrows step, Backspace clears. */
export function MarkRow({
  id,
  criterion,
  value,
  error,
  onSet,
  disabled,
}: {
  id: string;
  criterion: RubricCriterion;
  value: number | null;
  error: string | undefined;
  onSet: (v: number | null) => void;
  disabled: boolean;
}) {
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    if (e.ctrlKey || e.metaKey || e.altKey || disabled) return;
    if (/^[0-9]$/.test(e.key)) {
      e.preventDefault();
      const d = Number(e.key);
      if (d <= criterion.maxMark) {
        onSet(d);
        moveFocus(e.currentTarget, 1);
      }
    } else if (e.key === 'ArrowRight' || e.key === 'ArrowUp') {
      e.preventDefault();
      onSet(Math.min((value ?? -1) + 1, criterion.maxMark));
    } else if (e.key === 'ArrowLeft' || e.key === 'ArrowDown') {
      e.preventDefault();
      onSet(Math.max((value ?? 1) - 1, 0));
    } else if (e.key === 'Enter') {
      e.preventDefault();
      moveFocus(e.currentTarget, e.shiftKey ? -1 : 1);
    } else if (e.key === 'Backspace' || e.key === 'Delete') {
      e.preventDefault();
      onSet(null);
    }
  };
  const descriptor = value === null ? null : criterion.descriptors.find((d) => value >= d.min && value <= d.max);
  const labelId = `crit-${id}`;
  return (
    <div
      className="sm-std-row"
      tabIndex={0}
      data-std-stop
      role="group"
      aria-labelledby={labelId}
      aria-describedby={`${labelId}-value`}
      onKeyDown={onKey}
    >
      <div>
        <strong id={labelId}>{criterion.label}</strong>
        <div className="sm-muted" id={`${labelId}-value`}>
          {value === null ? `not marked yet (0–${criterion.maxMark})` : `${value} of ${criterion.maxMark}`}
        </div>
        {TENSION.test(criterion.key) && <p className="sm-field-hint">{TENSION_CAUTION}</p>}
      </div>
      <div>
        <span className="sm-std-marks">
          {Array.from({ length: criterion.maxMark + 1 }, (_, m) => (
            <button
              key={m}
              type="button"
              tabIndex={-1}
              className="sm-std-mark"
              aria-pressed={value === m}
              aria-label={`${criterion.label}: ${m} of ${criterion.maxMark}`}
              disabled={disabled}
              onClick={() => onSet(value === m ? null : m)}
            >
              {m}
            </button>
          ))}
        </span>
        <p className="sm-std-descriptor">{descriptor ? descriptor.text : <span className="sm-muted">Choose a mark to see its level descriptor.</span>}</p>
        {error && (
          <p className="sm-field-error" role="alert">
            {error}
          </p>
        )}
      </div>
    </div>
  );
}

