// The take-home report (issue 7 §5): strengths and next steps in plain words, from the criterion
// profile and the rubric's level descriptors, with the teacher's note; no raw figures.
import {
  roundHalfUp,
  TENSION_CAUTION,
  type LevelDescriptor,
  type ResultProfile,
  type TakeHomeReport,
} from '@stavemark/shared';

export interface CriterionScale {
  maxMark: number;
  descriptors: readonly LevelDescriptor[];
}

export interface TakeHomeInput {
  resultId: string;
  studentName: string;
  sittingTitle: string;
  /** "Thursday, 19 November 2026". */
  dateText: string;
  bandLabel: string;
  /** True for the lowest band (below every threshold). */
  belowEveryBand: boolean;
  profile: ResultProfile;
  /** Level descriptors per criterion key, from the pinned rubric versions. */
  scales: ReadonlyMap<string, CriterionScale>;
  teacherNote: string | null;
}

/** At or above this share of the maximum a criterion counts as a strength (from common teaching practice). */
export const STRENGTH_SHARE = 0.7;
const MAX_ITEMS = 3;
const TENSION = /tension|freedom/i;

/** The descriptor covering a mark, and the next one up (what the next level sounds like). */
export function levelOf(
  scale: CriterionScale,
  fraction: number,
): { now: LevelDescriptor | null; next: LevelDescriptor | null } {
  const mark = roundHalfUp(fraction * scale.maxMark);
  const sorted = [...scale.descriptors].sort((a, b) => a.min - b.min);
  const now = sorted.find((d) => mark >= d.min && mark <= d.max) ?? null;
  const next = sorted.find((d) => d.min > (now ? now.max : mark)) ?? null;
  return { now, next };
}

const lowerFirst = (s: string) => (s ? s[0]!.toLowerCase() + s.slice(1) : s);
const unquote = (s: string) => s.replace(/\.$/, '');

export function buildTakeHomeReport(input: TakeHomeInput): TakeHomeReport {
  const first = input.studentName.split(' ')[0] ?? input.studentName;
  const criteria = [...input.profile.criteria];
  const byStrength = [...criteria].sort((a, b) => b.fraction - a.fraction);
  const strong = byStrength.filter((c) => c.fraction >= STRENGTH_SHARE).slice(0, MAX_ITEMS);
  // Always name something that went well: the strongest area when none reached the strength share.
  const strengthsOf = strong.length ? strong : byStrength.slice(0, 1);
  const strengths = strengthsOf.map((c) => {
    const scale = input.scales.get(c.key);
    const now = scale ? levelOf(scale, c.fraction).now : null;
    return now ? `${c.label}: ${unquote(now.text)}.` : `${c.label} was a strong point.`;
  });

  const toWork = [...criteria]
    .filter((c) => !strengthsOf.includes(c))
    .sort((a, b) => a.fraction - b.fraction);
  const weak = toWork.filter((c) => c.fraction < STRENGTH_SHARE).slice(0, MAX_ITEMS);
  const nextOf = weak.length ? weak : toWork.slice(0, 1);
  const nextSteps = nextOf
    .map((c) => {
      const scale = input.scales.get(c.key);
      const { next } = scale ? levelOf(scale, c.fraction) : { next: null };
      return next
        ? `${c.label}: aim next for this — ${lowerFirst(unquote(next.text))}.`
        : `${c.label}: keep it as secure as it is now.`;
    })
    .filter((s) => s.length > 0);
  if (nextSteps.length === 0)
    nextSteps.push('Keep the same steady practice: every area is secure at this level.');

  const asked = input.profile.requests.filter((r) => r.asked && r.score !== null);
  const best = [...asked].sort((a, b) => (b.score ?? 0) - (a.score ?? 0))[0];
  const least = [...asked].sort((a, b) => (a.score ?? 0) - (b.score ?? 0))[0];
  const items =
    best && least && best.index !== least.index && (best.score ?? 0) > (least.score ?? 0)
      ? ` The most secure item was the ${best.label}; the one with most to gain from practice was the ${least.label}.`
      : '';
  const outcome = input.belowEveryBand
    ? `${first} has not yet reached a pass in this mock exam; the next steps below show where practice will count most.`
    : `${first} reached ${input.bandLabel} in this mock exam.`;

  const mentionsTension = [...strengthsOf, ...nextOf].some(
    (c) => TENSION.test(c.key) || TENSION.test(c.label),
  );
  return {
    resultId: input.resultId,
    studentName: input.studentName,
    sittingTitle: input.sittingTitle,
    date: input.dateText,
    outcome: input.bandLabel,
    summary: `${outcome}${items}`,
    strengths,
    nextSteps,
    teacherNote: input.teacherNote,
    caution: mentionsTension ? TENSION_CAUTION : null,
  };
}

/** "Thursday, 19 November 2026" (en-GB, as the web shows dates) for a YYYY-MM-DD date. */
export function longDate(date: string): string {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  return new Intl.DateTimeFormat('en-GB', {
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
    timeZone: 'UTC',
  }).format(new Date(Date.UTC(y, m - 1, d)));
}
