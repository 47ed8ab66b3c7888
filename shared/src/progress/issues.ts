// The teacher's attention list (design.md §4.3, §4.6, §10).
import type { SlotOutcome } from '../music/domain.js';

export interface SittingEvidence {
  sittingId: string;
  date: string;
  outcome: SlotOutcome;
  /** Everyone who marked the slot (first, second, third marker). */
  examinerIds: readonly string[];
  /** Per criterion: marks and maxima summed over the sitting's requests (the result's profile). */
  criteria: readonly { key: string; label?: string; marks: number; maximum: number }[];
}

export interface EntrenchedIssue {
  criterionKey: string;
  label: string;
  /** The run of low sittings, oldest first, ending with the latest completed sitting. */
  sittingIds: string[];
  fractions: number[];
  examinerIds: string[];
  since: string;
}

export interface EntrenchedOptions {
  /** Below this share of the maximum counts as low. Default 0.6 (design.md §4.6). */
  threshold?: number;
  /** Consecutive low sittings needed. Default 3. */
  run?: number;
  /** Different examiners needed across the run. Default 2. */
  minExaminers?: number;
}

/**
 * Entrenched issues: a criterion below 60 % of its maximum in three consecutive completed sittings,
 * marked by at least two different examiners across those sittings (so one examiner's habit is
 * not taken for the student's). Absent, withdrawn and incomplete sittings are skipped, neither
 * breaking nor extending a run; a completed sitting that did not assess the criterion breaks it.
 * Only current issues are returned: runs that reach the latest completed sitting.
 */
export function entrenchedIssues(
  sittings: readonly SittingEvidence[],
  options: EntrenchedOptions = {},
): EntrenchedIssue[] {
  const threshold = options.threshold ?? 0.6;
  const run = options.run ?? 3;
  const minExaminers = options.minExaminers ?? 2;
  const done = sittings
    .map((s, i) => {
      const ms = Date.parse(s.date);
      if (!Number.isFinite(ms))
        throw new RangeError(`Sitting ${i + 1}: "${s.date}" is not a date.`);
      return { s, ms };
    })
    .filter(({ s }) => s.outcome === 'completed')
    .sort((a, b) => a.ms - b.ms)
    .map(({ s }) => s);

  const labels = new Map<string, string>();
  for (const s of done)
    for (const c of s.criteria) if (!labels.has(c.key)) labels.set(c.key, c.label ?? c.key);

  const issues: EntrenchedIssue[] = [];
  for (const [key, label] of labels) {
    const streak: { s: SittingEvidence; fraction: number }[] = [];
    for (const s of done) {
      const c = s.criteria.find((x) => x.key === key);
      if (!c || !(c.maximum > 0)) {
        streak.length = 0;
        continue;
      }
      const fraction = c.marks / c.maximum;
      if (fraction < threshold) streak.push({ s, fraction });
      else streak.length = 0;
    }
    if (streak.length < run) continue;
    const examiners = [...new Set(streak.flatMap((x) => x.s.examinerIds))];
    if (examiners.length < minExaminers) continue;
    issues.push({
      criterionKey: key,
      label,
      sittingIds: streak.map((x) => x.s.sittingId),
      fractions: streak.map((x) => x.fraction),
      examinerIds: examiners,
      since: streak[0]!.s.date,
    });
  }
  return issues;
}

/** Slips per 100 notes played (design.md §4.3). */
export function slipRate({ slips, notesPlayed }: { slips: number; notesPlayed: number }): number {
  if (!Number.isInteger(slips) || slips < 0)
    throw new RangeError('slips must be a whole number ≥ 0.');
  if (!(notesPlayed > 0)) throw new RangeError('notesPlayed must be greater than 0.');
  return (slips / notesPlayed) * 100;
}

/**
 * Consistency over a period: the share of attempts at a request with no slip (design.md §4.3).
 * Null when there is no attempt.
 */
export function consistencyShare(
  attempts: readonly { slips: number }[],
): { share: number; n: number } | null {
  if (attempts.length === 0) return null;
  const clean = attempts.filter((a) => {
    if (!Number.isInteger(a.slips) || a.slips < 0)
      throw new RangeError('slips must be whole numbers ≥ 0.');
    return a.slips === 0;
  }).length;
  return { share: clean / attempts.length, n: attempts.length };
}

/**
 * Caution shown wherever tension or pain-related information appears (design.md §10), in our words.
 */
export const TENSION_CAUTION =
  'Persistent tension can contribute to playing-related pain. If a student reports pain, stop and seek advice from a qualified health professional. This tool records teaching observations and does not diagnose.';
