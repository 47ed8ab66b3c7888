// Mark sheets to totals, bands and criterion profiles (design.md §4.1).
import type { RubricCriterion, SlotOutcome } from '../music/domain.js';
import { bandFor, DEFAULT_BAND_POLICY, type Band, type BandPolicy } from './bands.js';
import { roundHalfUp } from './rounding.js';

export type ScoringCriterion = Pick<RubricCriterion, 'key' | 'label' | 'weight' | 'maxMark'>;

export interface SheetRequestInput {
  /** Identifies the request on the sheet (e.g. its draw index). */
  key: string;
  /** False when the examiner did not ask it: then it is left out entirely. */
  asked: boolean;
  difficultyWeight: number;
  criteria: readonly ScoringCriterion[];
  /** Mark per criterion key; integers 0..maxMark. */
  marks: Readonly<Record<string, number | null | undefined>>;
}

export type RequestWeighting = 'difficulty' | 'equal';

export interface MarkSheetInput {
  outcome: SlotOutcome;
  /** The list's total marks, the scale of the sheet total. */
  totalMarks: number;
  requests: readonly SheetRequestInput[];
  /** How requests weigh in the total: by their line's difficulty weight (default) or equally. */
  weighting?: RequestWeighting;
  policy?: BandPolicy;
}

export interface RequestScore {
  key: string;
  /** Weighted mean of criterion fractions, 0..1. */
  score: number;
  /** The request's share of the total marks (its maximum contribution). */
  maximum: number;
  /** Its contribution to the total before rounding (score × maximum). */
  marks: number;
  /** Raw sum of criterion marks and of their maxima, as the examiner sees them. */
  rawMarks: number;
  rawMaximum: number;
}

export interface CriterionProfileEntry {
  key: string;
  label: string;
  marks: number;
  maximum: number;
  /** marks ÷ maximum over the asked requests that use the criterion. */
  fraction: number;
  requests: number;
}

export type SheetScore =
  | { status: 'no_result'; outcome: Exclude<SlotOutcome, 'completed'> }
  | {
      status: 'scored';
      /** Rounded half up to a whole mark. */
      total: number;
      /** Before rounding, for audit and moderation. */
      exactTotal: number;
      totalMarks: number;
      /** total ÷ totalMarks × 100, unrounded. */
      percentage: number;
      band: Band;
      weighting: RequestWeighting;
      requests: RequestScore[];
      /** Requests left out because they were not asked. */
      notAsked: string[];
      profile: CriterionProfileEntry[];
    };

export class MarkSheetError extends Error {
  constructor(
    message: string,
    readonly details: { path: string; message: string }[],
  ) {
    super(message);
    this.name = 'MarkSheetError';
  }
}

/**
 * Scores one examiner's sheet. A request's score is the weighted mean of its criteria, each as a
 * fraction of its maximum (so a criterion's weight is its share whatever its mark scale); the total
 * is the weighted sum of request scores (difficulty weights, or equal) scaled to the list's total
 * marks, rounded half up to a whole mark; the band is taken on that rounded total. Requests not
 * asked are excluded; absent, withdrawn and incomplete slots give no result. Missing or invalid
 * marks on an asked request throw a MarkSheetError listing every offending cell.
 */
export function scoreMarkSheet(input: MarkSheetInput): SheetScore {
  if (input.outcome !== 'completed') return { status: 'no_result', outcome: input.outcome };
  const { totalMarks } = input;
  if (!Number.isFinite(totalMarks) || totalMarks <= 0)
    throw new RangeError(`totalMarks must be positive, got ${String(totalMarks)}.`);
  const weighting = input.weighting ?? 'difficulty';
  const problems: { path: string; message: string }[] = [];
  const asked = input.requests.filter((r) => r.asked);
  if (asked.length === 0)
    throw new MarkSheetError('No request was asked: there is nothing to score.', []);

  const seenKeys = new Set<string>();
  for (const r of input.requests) {
    if (seenKeys.has(r.key))
      problems.push({ path: r.key, message: `Request "${r.key}" appears twice.` });
    seenKeys.add(r.key);
  }
  for (const r of asked) {
    if (weighting === 'difficulty' && !(r.difficultyWeight > 0)) {
      problems.push({
        path: `${r.key}.difficultyWeight`,
        message: 'Difficulty weight must be greater than 0.',
      });
    }
    if (r.criteria.length === 0)
      problems.push({ path: r.key, message: 'The request has no criteria.' });
    for (const c of r.criteria) {
      const m = r.marks[c.key];
      const path = `${r.key}.${c.key}`;
      if (!(c.weight > 0))
        problems.push({ path, message: 'Criterion weight must be greater than 0.' });
      if (!Number.isInteger(c.maxMark) || c.maxMark < 1 || c.maxMark > 10)
        problems.push({ path, message: 'Maximum mark must be 1 to 10.' });
      if (m === null || m === undefined) problems.push({ path, message: 'No mark given.' });
      else if (!Number.isInteger(m) || m < 0 || m > c.maxMark)
        problems.push({ path, message: `Mark ${m} is not a whole number from 0 to ${c.maxMark}.` });
    }
  }
  if (problems.length > 0)
    throw new MarkSheetError(
      `The sheet cannot be scored: ${problems.length} problem(s).`,
      problems,
    );

  const weightOf = (r: SheetRequestInput) => (weighting === 'equal' ? 1 : r.difficultyWeight);
  const weightSum = asked.reduce((s, r) => s + weightOf(r), 0);
  const requests: RequestScore[] = asked.map((r) => {
    let wSum = 0;
    let wFrac = 0;
    let raw = 0;
    let rawMax = 0;
    for (const c of r.criteria) {
      const m = r.marks[c.key] as number;
      wSum += c.weight;
      wFrac += (c.weight * m) / c.maxMark;
      raw += m;
      rawMax += c.maxMark;
    }
    const score = wFrac / wSum;
    const maximum = (totalMarks * weightOf(r)) / weightSum;
    return {
      key: r.key,
      score,
      maximum,
      marks: score * maximum,
      rawMarks: raw,
      rawMaximum: rawMax,
    };
  });
  const exactTotal = requests.reduce((s, r) => s + r.marks, 0);
  // Clamp the tiny overshoot floating point can give on a perfect sheet.
  const total = Math.min(totalMarks, roundHalfUp(exactTotal));
  const band = bandFor(total, input.policy ?? DEFAULT_BAND_POLICY, totalMarks);
  return {
    status: 'scored',
    total,
    exactTotal,
    totalMarks,
    percentage: (total / totalMarks) * 100,
    band,
    weighting,
    requests,
    notAsked: input.requests.filter((r) => !r.asked).map((r) => r.key),
    profile: criterionProfile(asked),
  };
}

/**
 * Per-criterion profile over the asked requests: for each criterion key, the sum of its marks over
 * the sum of its maxima (a plain, unweighted share, so a student reads it as "marks out of").
 * Keys keep the order in which they first appear.
 */
export function criterionProfile(
  requests: readonly Pick<SheetRequestInput, 'criteria' | 'marks'>[],
): CriterionProfileEntry[] {
  const byKey = new Map<string, CriterionProfileEntry>();
  for (const r of requests) {
    for (const c of r.criteria) {
      const m = r.marks[c.key];
      if (m === null || m === undefined) continue;
      const e = byKey.get(c.key) ?? {
        key: c.key,
        label: c.label,
        marks: 0,
        maximum: 0,
        fraction: 0,
        requests: 0,
      };
      e.marks += m;
      e.maximum += c.maxMark;
      e.requests += 1;
      byKey.set(c.key, e);
    }
  }
  return [...byKey.values()].map((e) => ({
    ...e,
    fraction: e.maximum > 0 ? e.marks / e.maximum : 0,
  }));
}
