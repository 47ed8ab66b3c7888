import type { CellValue, DeskCriterion } from '@stavemark/shared';

/** 0..max as large buttons; the chosen one is pressed. Clicking it again clears the mark. */
export function MarkButtons({
  criterion,
  value,
  disabled,
  onSet,
}: {
  criterion: DeskCriterion;
  value: CellValue | undefined;
  disabled: boolean;
  onSet: (v: number | null) => void;
}) {
  const marks = Array.from({ length: criterion.maxMark + 1 }, (_, i) => i);
  return (
    <span className="sm-desk-marks">
      {marks.map((m) => (
        <button
          key={m}
          type="button"
          tabIndex={-1}
          className={`sm-desk-mark${value === m ? ' sm-desk-mark--on' : ''}`}
          aria-pressed={value === m}
          aria-label={`${criterion.label}: ${m} of ${criterion.maxMark}`}
          disabled={disabled}
          onClick={() => onSet(value === m ? null : m)}
        >
          {m}
        </button>
      ))}
    </span>
  );
}
