// The teacher's attention list (design.md §4.6, §10; issue 8 §2): which students' habits need a
// look, from their completed sittings. The entrenched rule lives in issues.ts; these are the two
// other signals, with thresholds that are this product's own choice (not from an outside source).
import { trend } from './trend.js';

/** Is this criterion about freedom from tension (the health caution of design.md §10 applies)? */
export function isTensionCriterion(c: { key: string; label?: string }): boolean {
  return /tension/i.test(c.key) || /tension/i.test(c.label ?? '');
}

export interface CriterionPoint {
  sittingId: string;
  date: string;
  /** The criterion's share of its maximum in that sitting (0..1). */
  fraction: number;
}

export interface PersistentLowOptions {
  /** Below this share counts as low. Default 0.6, as the entrenched rule. */
  threshold?: number;
  /** Look at this many latest completed sittings. Default 4. */
  window?: number;
  /** Low in at least this many of them. Default 3. */
  minLow?: number;
}

/**
 * Persistent low marks: the criterion below 60 % in at least 3 of the latest 4 completed sittings
 * that assessed it, the latest included (so a resolved habit drops off). Unlike the entrenched
 * rule, one good day does not reset it and one examiner is enough: for tension the list errs on
 * the side of a look. Returns the low sittings, oldest first, or null.
 */
export function persistentLow(
  points: readonly CriterionPoint[],
  options: PersistentLowOptions = {},
): CriterionPoint[] | null {
  const threshold = options.threshold ?? 0.6;
  const window = options.window ?? 4;
  const minLow = options.minLow ?? 3;
  const recent = [...points]
    .sort((a, b) => Date.parse(a.date) - Date.parse(b.date))
    .slice(-window);
  const low = recent.filter((p) => p.fraction < threshold);
  const latest = recent[recent.length - 1];
  if (!latest || latest.fraction >= threshold || low.length < minLow) return null;
  return low;
}

export interface SlipPoint {
  sittingId: string;
  date: string;
  slips: number;
  notesPlayed: number;
}

export interface RisingSlips {
  /** Slips per 100 notes in each sitting considered, oldest first. */
  points: { sittingId: string; date: string; rate: number }[];
  /** Least-squares slope of the rate, per 30 days. */
  slopePer30Days: number;
  first: number;
  latest: number;
}

export interface RisingSlipOptions {
  /** The latest this many completed sittings with notes counted. Default 4 (at least 3 needed). */
  window?: number;
  /** Slope at least this many slips per 100 notes per 30 days. Default 0.5. */
  minSlope?: number;
  /** The latest rate at least this many times the first of the window. Default 1.5. */
  minRatio?: number;
  /** And at least this many per 100 notes, so 0.2 → 0.4 does not count. Default 2. */
  minLatest?: number;
}

/**
 * A rising slip rate: over the latest 4 completed sittings (at least 3) the rate per 100 notes
 * (design.md §4.3) rises by at least 0.5 per 30 days on a least-squares line, and the latest is at
 * least 1.5 × the first and at least 2 per 100 notes. Null otherwise.
 */
export function risingSlipRate(
  sittings: readonly SlipPoint[],
  options: RisingSlipOptions = {},
): RisingSlips | null {
  const window = options.window ?? 4;
  const points = sittings
    .filter((s) => s.notesPlayed > 0)
    .sort((a, b) => Date.parse(a.date) - Date.parse(b.date))
    .slice(-window)
    .map((s) => ({ sittingId: s.sittingId, date: s.date, rate: (100 * s.slips) / s.notesPlayed }));
  if (points.length < 3) return null;
  const t = trend(points.map((p) => ({ date: p.date, percent: Math.min(100, p.rate) })));
  const first = points[0]!.rate;
  const latest = points[points.length - 1]!.rate;
  if (t.slopePer30Days === null || t.slopePer30Days < (options.minSlope ?? 0.5)) return null;
  if (latest < (options.minRatio ?? 1.5) * first || latest < (options.minLatest ?? 2)) return null;
  return { points, slopePer30Days: t.slopePer30Days, first, latest };
}
