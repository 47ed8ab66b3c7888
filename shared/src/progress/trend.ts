// Progress over a year (design.md §4.6): trend per 30 days, first-vs-latest change, percentile.
import type { SlotOutcome } from '../music/domain.js';

export interface ProgressPoint {
  /** ISO date or date-time, or milliseconds since the epoch. */
  date: string | number;
  /** Percentage of the total marks, 0..100. */
  percent: number;
  /** Non-completed sittings are shown as such in charts but never enter a computation. */
  outcome?: SlotOutcome;
  /** Requirement-list lineage and grade: a change of either starts a new comparable line. */
  lineageId?: string;
  grade?: string;
}

export interface Trend {
  /** Completed points used. */
  n: number;
  /** Least-squares slope in percentage points per 30 days; null below 2 points or one date only. */
  slopePer30Days: number | null;
  /** Its standard error (√(SSE/(n−2)/Sxx) × 30); null below 3 points. */
  standardError: number | null;
  /** Fitted percentage at the first date. */
  intercept: number | null;
  firstToLatest: { first: number; latest: number; change: number } | null;
}

const DAY_MS = 86_400_000;

function toMs(date: string | number, i: number): number {
  const ms = typeof date === 'number' ? date : Date.parse(date);
  if (!Number.isFinite(ms))
    throw new RangeError(`Point ${i + 1}: "${String(date)}" is not a date.`);
  return ms;
}

function completedSorted(points: readonly ProgressPoint[]): { ms: number; percent: number }[] {
  return points
    .map((p, i) => {
      if (!Number.isFinite(p.percent) || p.percent < 0 || p.percent > 100)
        throw new RangeError(`Point ${i + 1}: percent must be 0..100.`);
      return {
        ms: toMs(p.date, i),
        percent: p.percent,
        completed: (p.outcome ?? 'completed') === 'completed',
      };
    })
    .filter((p) => p.completed)
    .sort((a, b) => a.ms - b.ms)
    .map(({ ms, percent }) => ({ ms, percent }));
}

/**
 * Ordinary least-squares trend of the percentage over time (x in days from the first sitting),
 * reported per 30 days. Only completed sittings count; the caller passes one comparable line
 * (see splitComparable), since a new grade or list is not the same scale.
 */
export function trend(points: readonly ProgressPoint[]): Trend {
  const pts = completedSorted(points);
  const n = pts.length;
  const firstToLatest =
    n >= 1
      ? {
          first: pts[0]!.percent,
          latest: pts[n - 1]!.percent,
          change: pts[n - 1]!.percent - pts[0]!.percent,
        }
      : null;
  if (n < 2)
    return { n, slopePer30Days: null, standardError: null, intercept: null, firstToLatest };
  const t0 = pts[0]!.ms;
  const xs = pts.map((p) => (p.ms - t0) / DAY_MS);
  const ys = pts.map((p) => p.percent);
  const mx = xs.reduce((a, b) => a + b, 0) / n;
  const my = ys.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += ((xs[i] as number) - mx) ** 2;
    sxy += ((xs[i] as number) - mx) * ((ys[i] as number) - my);
  }
  if (sxx === 0)
    return { n, slopePer30Days: null, standardError: null, intercept: null, firstToLatest };
  const b = sxy / sxx;
  const a = my - b * mx;
  let se: number | null = null;
  if (n >= 3) {
    let sse = 0;
    for (let i = 0; i < n; i++) sse += ((ys[i] as number) - (a + b * (xs[i] as number))) ** 2;
    se = Math.sqrt(sse / (n - 2) / sxx) * 30;
  }
  return { n, slopePer30Days: b * 30, standardError: se, intercept: a, firstToLatest };
}

/**
 * Splits a student's points into comparable lines: consecutive points (by date) with the same
 * requirement-list lineage and grade. A change of grade or list starts a new line.
 */
export function splitComparable<T extends ProgressPoint>(points: readonly T[]): T[][] {
  const sorted = points.map((p, i) => ({ p, ms: toMs(p.date, i) })).sort((a, b) => a.ms - b.ms);
  const lines: T[][] = [];
  let key: string | null = null;
  for (const { p } of sorted) {
    const k = `${p.lineageId ?? ''}\u0000${p.grade ?? ''}`;
    if (k !== key) {
      lines.push([]);
      key = k;
    }
    lines[lines.length - 1]!.push(p);
  }
  return lines;
}

/** Percentiles are hidden below this many students in the grade (design.md §4.6). */
export const MIN_STUDENTS_FOR_PERCENTILE = 10;

/**
 * Percentile rank (0..100) of a student's value among all students of the same grade (the
 * student's own value included): the share of values below it, ties counted half — the
 * definition of simple-statistics' quantileRank. Null when fewer than 10 students, so that no
 * one can be singled out.
 */
export function percentileInGrade(value: number, gradeValues: readonly number[]): number | null {
  if (!Number.isFinite(value)) throw new RangeError('The value must be a number.');
  if (gradeValues.some((v) => !Number.isFinite(v)))
    throw new RangeError('Every grade value must be a number.');
  if (gradeValues.length < MIN_STUDENTS_FOR_PERCENTILE) return null;
  const sorted = [...gradeValues].sort((a, b) => a - b);
  const n = sorted.length;
  if (value < (sorted[0] as number)) return 0;
  if (value > (sorted[n - 1] as number)) return 100;
  return percentileFromCounts({
    below: sorted.filter((v) => v < value).length,
    equal: sorted.filter((v) => v === value).length,
    n,
  });
}

/**
 * percentileInGrade from counts alone — how many of the grade's n values are below the student's
 * and how many equal it — so a database can count them on an index instead of sending every value.
 * Null below 10 students, as there.
 */
export function percentileFromCounts(counts: {
  below: number;
  equal: number;
  n: number;
}): number | null {
  const { below, equal, n } = counts;
  if (![below, equal, n].every((x) => Number.isInteger(x) && x >= 0) || below + equal > n)
    throw new RangeError('The counts must be whole numbers with below + equal ≤ n.');
  if (n < MIN_STUDENTS_FOR_PERCENTILE) return null;
  // No equal value: its position among the sorted values; otherwise the mean rank of the ties.
  // (Below every value this is 0, above every value n / n = 100, as percentileInGrade says.)
  const rank = equal === 0 ? below / n : (below + (equal + 1) / 2) / n;
  return rank * 100;
}
