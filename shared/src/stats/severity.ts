// Examiner severity: mean difference from the other marker or from reference marks (design.md §4.5).
import { tQuantile } from './distributions.js';

/** Severity is shown only from this many sheets (design.md §4.5). */
export const MIN_SHEETS_FOR_SEVERITY = 20;
/** Below this many double-marked candidates the ICC gets no interpretation (design.md §4.5). */
export const MIN_CANDIDATES_FOR_ICC = 30;

export interface SeverityResult {
  /** Mean of (examiner − other): negative means the examiner marks lower (more severe). */
  meanDifference: number;
  /** Sample standard deviation of the differences (n − 1). */
  standardDeviation: number | null;
  /** sd / √n. */
  standardError: number | null;
  /** 95 % t interval of the mean difference. */
  lower: number | null;
  upper: number | null;
  n: number;
  /** Whether n reaches MIN_SHEETS_FOR_SEVERITY, so the figure may be shown. */
  enough: boolean;
}

/**
 * Severity from pairs of marks on the same sheets (the examiner's and the other marker's or the
 * reference). Pairs with a missing side are left out. Standard error and interval need n ≥ 2.
 */
export function severity(
  pairs: readonly { examiner: number | null; other: number | null }[],
): SeverityResult {
  const d: number[] = [];
  pairs.forEach((p, i) => {
    if (p.examiner === null || p.other === null) return;
    if (!Number.isFinite(p.examiner) || !Number.isFinite(p.other))
      throw new RangeError(`Pair ${i + 1} is not two numbers.`);
    d.push(p.examiner - p.other);
  });
  const n = d.length;
  if (n === 0) throw new RangeError('No complete pair of marks.');
  const mean = d.reduce((a, b) => a + b, 0) / n;
  if (n < 2)
    return {
      meanDifference: mean,
      standardDeviation: null,
      standardError: null,
      lower: null,
      upper: null,
      n,
      enough: false,
    };
  const sd = Math.sqrt(d.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1));
  const se = sd / Math.sqrt(n);
  const t = tQuantile(0.975, n - 1);
  return {
    meanDifference: mean,
    standardDeviation: sd,
    standardError: se,
    lower: mean - t * se,
    upper: mean + t * se,
    n,
    enough: n >= MIN_SHEETS_FOR_SEVERITY,
  };
}
