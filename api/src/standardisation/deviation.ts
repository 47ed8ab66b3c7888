// Pure rules of standardisation (issue 7 §4): checking marks against the rubric, an examiner's
// deviation from the reference marks, and the agreement of all examiners on one exercise.
import {
  interpret,
  KRIPPENDORFF_2004,
  krippendorffAlpha,
  type CriterionDeviation,
  type ExerciseAgreement,
  type ExerciseDeviation,
  type ExerciseMark,
  type RubricCriterion,
} from '@stavemark/shared';

export type Problem = { path: string; message: string };

const cellKey = (m: Pick<ExerciseMark, 'request' | 'criterion'>) => `${m.request}:${m.criterion}`;

/** Problems with marks for `requests` requests on these criteria; `complete` asks for every cell. */
export function checkMarks(
  marks: readonly ExerciseMark[],
  requests: number,
  criteria: readonly RubricCriterion[],
  complete: boolean,
): Problem[] {
  const problems: Problem[] = [];
  const byKey = new Map(criteria.map((c) => [c.key, c]));
  marks.forEach((m, i) => {
    const c = byKey.get(m.criterion);
    if (m.request >= requests)
      problems.push({ path: `marks.${i}.request`, message: `There is no request ${m.request + 1}: the exercise has ${requests}.` });
    else if (!c) problems.push({ path: `marks.${i}.criterion`, message: `“${m.criterion}” is not a criterion of this rubric.` });
    else if (m.mark > c.maxMark)
      problems.push({ path: `marks.${i}.mark`, message: `Request ${m.request + 1}, ${c.label}: ${m.mark} is above the maximum of ${c.maxMark}.` });
  });
  if (complete) {
    const given = new Set(marks.map(cellKey));
    for (let r = 0; r < requests; r++)
      for (const c of criteria)
        if (!given.has(`${r}:${c.key}`))
          problems.push({ path: `marks.${r}.${c.key}`, message: `Request ${r + 1}: ${c.label} has no mark.` });
  }
  return problems;
}

/** Examiner − reference per criterion (over the requests) and over every cell as a share of the maximum. */
export function deviationFrom(
  marks: readonly ExerciseMark[],
  reference: readonly ExerciseMark[],
  criteria: readonly RubricCriterion[],
): ExerciseDeviation {
  const mine = new Map(marks.map((m) => [cellKey(m), m.mark]));
  const per = new Map<string, { c: RubricCriterion; diffs: number[] }>();
  let sumPct = 0;
  let sumAbsPct = 0;
  let exact = 0;
  let cells = 0;
  for (const ref of reference) {
    const c = criteria.find((x) => x.key === ref.criterion);
    const m = mine.get(cellKey(ref));
    if (!c || m === undefined) continue;
    const d = m - ref.mark;
    const e = per.get(c.key) ?? { c, diffs: [] };
    e.diffs.push(d);
    per.set(c.key, e);
    sumPct += (d / c.maxMark) * 100;
    sumAbsPct += (Math.abs(d) / c.maxMark) * 100;
    if (d === 0) exact++;
    cells++;
  }
  const criteriaOut: CriterionDeviation[] = criteria
    .filter((c) => per.has(c.key))
    .map((c) => {
      const { diffs } = per.get(c.key)!;
      return {
        criterion: c.key,
        label: c.label,
        maxMark: c.maxMark,
        n: diffs.length,
        meanDifference: diffs.reduce((a, b) => a + b, 0) / diffs.length,
        meanAbsoluteDifference: diffs.reduce((a, b) => a + Math.abs(b), 0) / diffs.length,
      };
    });
  return {
    criteria: criteriaOut,
    meanDifferencePercent: cells ? sumPct / cells : 0,
    meanAbsoluteDifferencePercent: cells ? sumAbsPct / cells : 0,
    exactShare: cells ? exact / cells : 0,
    cells,
  };
}

/** Pools criterion deviations of several exercises (cells weighted equally). */
export function poolCriteria(lists: readonly CriterionDeviation[][]): CriterionDeviation[] {
  const out = new Map<string, CriterionDeviation>();
  for (const list of lists)
    for (const c of list) {
      const e = out.get(c.criterion);
      if (!e) {
        out.set(c.criterion, { ...c });
        continue;
      }
      const n = e.n + c.n;
      e.meanDifference = (e.meanDifference * e.n + c.meanDifference * c.n) / n;
      e.meanAbsoluteDifference = (e.meanAbsoluteDifference * e.n + c.meanAbsoluteDifference * c.n) / n;
      e.n = n;
    }
  return [...out.values()];
}

const ALPHA_METHOD =
  "Krippendorff's alpha, ordinal metric, on each mark as a share of its criterion's maximum (so criteria marked out of 5 and out of 10 share one ordered scale); computed as in Krippendorff, K. (2011), Computing Krippendorff's alpha-reliability.";

/** Agreement of every submitted examiner on the exercise's cells (request × criterion). */
export function exerciseAgreement(
  attempts: readonly (readonly ExerciseMark[])[],
  requests: number,
  criteria: readonly RubricCriterion[],
): ExerciseAgreement {
  const units: { request: number; c: RubricCriterion }[] = [];
  for (let r = 0; r < requests; r++) for (const c of criteria) units.push({ request: r, c });
  const base = { examiners: attempts.length, units: units.length, level: 'ordinal' as const, method: ALPHA_METHOD };
  if (attempts.length < 2)
    return { ...base, alpha: null, interpretation: null, note: 'Agreement needs at least two examiners’ submitted marks.' };
  const data = attempts.map((marks) => {
    const m = new Map(marks.map((x) => [cellKey(x), x.mark]));
    return units.map((u) => {
      const v = m.get(`${u.request}:${u.c.key}`);
      return v === undefined ? null : v / u.c.maxMark;
    });
  });
  try {
    const a = krippendorffAlpha(data, 'ordinal');
    return { ...base, alpha: a.value, interpretation: interpret(a.value, KRIPPENDORFF_2004), note: null };
  } catch (e) {
    return { ...base, alpha: null, interpretation: null, note: `No alpha: ${(e as Error).message}` };
  }
}
