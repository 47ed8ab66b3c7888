// Tolerance between two examiners' sheets for the same slot (design.md §4.5).
import type { SheetScore } from './scoring.js';

export interface Tolerance {
  /** A request is flagged when the two scores differ by more than this share of its maximum. */
  requestShare: number;
  /** The total is flagged when the totals differ by more than this share of the total marks. */
  totalShare: number;
}

/** Design.md §4.5: 20 % of a request's maximum, 6 % of the total marks. */
export const DEFAULT_TOLERANCE: Tolerance = { requestShare: 0.2, totalShare: 0.06 };

export interface RequestComparison {
  key: string;
  a: number | null;
  b: number | null;
  /** |a − b| as a share of the request's maximum (0..1); null when one side did not ask it. */
  difference: number | null;
  flagged: boolean;
  reason: 'within' | 'over_tolerance' | 'asked_by_one_only';
}

export interface SheetComparison {
  flagged: boolean;
  requests: RequestComparison[];
  total: { a: number; b: number; difference: number; limit: number; flagged: boolean };
}

/**
 * Compares two scored sheets of one slot. A request is flagged when the scores differ by more than
 * `requestShare` of its maximum (a score is already a fraction of the maximum, so this holds for
 * its marks in the total too), or when only one examiner asked it; the total is flagged when the
 * rounded totals differ by more than `totalShare` of the total marks. "More than" is strict: a
 * difference of exactly 20 % is within tolerance.
 */
export function compareSheets(
  a: SheetScore,
  b: SheetScore,
  tolerance: Tolerance = DEFAULT_TOLERANCE,
): SheetComparison {
  if (a.status !== 'scored' || b.status !== 'scored')
    throw new RangeError('Only two scored sheets can be compared.');
  if (a.totalMarks !== b.totalMarks)
    throw new RangeError(
      `The sheets are out of different totals (${a.totalMarks} and ${b.totalMarks}).`,
    );
  const eps = 1e-9;
  const aBy = new Map(a.requests.map((r) => [r.key, r]));
  const bBy = new Map(b.requests.map((r) => [r.key, r]));
  const keys = [...new Set([...aBy.keys(), ...bBy.keys()])];
  const requests: RequestComparison[] = keys.map((key) => {
    const ra = aBy.get(key);
    const rb = bBy.get(key);
    if (!ra || !rb) {
      return {
        key,
        a: ra?.score ?? null,
        b: rb?.score ?? null,
        difference: null,
        flagged: true,
        reason: 'asked_by_one_only',
      };
    }
    const difference = Math.abs(ra.score - rb.score);
    const flagged = difference > tolerance.requestShare + eps;
    return {
      key,
      a: ra.score,
      b: rb.score,
      difference,
      flagged,
      reason: flagged ? 'over_tolerance' : 'within',
    };
  });
  const diff = Math.abs(a.total - b.total);
  const limit = tolerance.totalShare * a.totalMarks;
  const total = { a: a.total, b: b.total, difference: diff, limit, flagged: diff > limit + eps };
  return { flagged: total.flagged || requests.some((r) => r.flagged), requests, total };
}
