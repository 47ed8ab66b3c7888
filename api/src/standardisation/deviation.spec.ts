import { describe, expect, it } from 'vitest';
import { KRIPPENDORFF_2004, type ExerciseMark, type RubricCriterion } from '@stavemark/shared';
import { checkMarks, deviationFrom, exerciseAgreement, poolCriteria } from './deviation.js';

const crit = (key: string, maxMark: number): RubricCriterion => ({ key, label: key.replace('_', ' '), weight: 1, maxMark, descriptors: [] });
const ACC = crit('accuracy', 10);
const EVEN = crit('evenness', 5);
const m = (request: number, criterion: string, mark: number): ExerciseMark => ({ request, criterion, mark });

describe('checking marks against the rubric', () => {
  it('names each bad cell, and every missing one when the marks must be complete', () => {
    const problems = checkMarks([m(0, 'accuracy', 11), m(2, 'accuracy', 3), m(0, 'tone', 3), m(1, 'evenness', 5)], 2, [ACC, EVEN], true);
    expect(problems).toEqual([
      { path: 'marks.0.mark', message: 'Request 1, accuracy: 11 is above the maximum of 10.' },
      { path: 'marks.1.request', message: 'There is no request 3: the exercise has 2.' },
      { path: 'marks.2.criterion', message: '“tone” is not a criterion of this rubric.' },
      { path: 'marks.0.evenness', message: 'Request 1: evenness has no mark.' },
      { path: 'marks.1.accuracy', message: 'Request 2: accuracy has no mark.' },
    ]);
    expect(checkMarks([m(0, 'accuracy', 7)], 1, [ACC, EVEN], false)).toEqual([]);
  });
});

describe('deviation from the reference (hand-worked)', () => {
  // Reference: request 1 accuracy 8, evenness 4; request 2 accuracy 6, evenness 3.
  // Examiner:  request 1 accuracy 7, evenness 4; request 2 accuracy 4, evenness 4.
  const reference = [m(0, 'accuracy', 8), m(0, 'evenness', 4), m(1, 'accuracy', 6), m(1, 'evenness', 3)];
  const marks = [m(0, 'accuracy', 7), m(0, 'evenness', 4), m(1, 'accuracy', 4), m(1, 'evenness', 4)];
  it('per criterion: accuracy −1.5 (mean |d| 1.5), evenness +0.5 (mean |d| 0.5)', () => {
    const d = deviationFrom(marks, reference, [ACC, EVEN]);
    expect(d.criteria).toEqual([
      { criterion: 'accuracy', label: 'accuracy', maxMark: 10, n: 2, meanDifference: -1.5, meanAbsoluteDifference: 1.5 },
      { criterion: 'evenness', label: 'evenness', maxMark: 5, n: 2, meanDifference: 0.5, meanAbsoluteDifference: 0.5 },
    ]);
    // As shares of the maximum: −10 %, 0 %, −20 %, +20 % → mean −2.5 points, mean |d| 12.5; 1 of 4 exact.
    expect(d.meanDifferencePercent).toBeCloseTo(-2.5, 12);
    expect(d.meanAbsoluteDifferencePercent).toBeCloseTo(12.5, 12);
    expect(d.exactShare).toBe(0.25);
    expect(d.cells).toBe(4);
  });
  it('pooled over two exercises, cells weigh equally', () => {
    const pooled = poolCriteria([
      [{ criterion: 'accuracy', label: 'accuracy', maxMark: 10, n: 2, meanDifference: -1.5, meanAbsoluteDifference: 1.5 }],
      [{ criterion: 'accuracy', label: 'accuracy', maxMark: 10, n: 1, meanDifference: 3, meanAbsoluteDifference: 3 }],
    ]);
    // (−1.5·2 + 3)/3 = 0; (1.5·2 + 3)/3 = 2.
    expect(pooled).toEqual([{ criterion: 'accuracy', label: 'accuracy', maxMark: 10, n: 3, meanDifference: 0, meanAbsoluteDifference: 2 }]);
  });
});

describe("agreement of all examiners: Krippendorff's alpha, ordinal", () => {
  it('reproduces the published ordinal α = 0.815 of Krippendorff (2011), example with missing values (4 observers × 12 units)', () => {
    // Twelve requests of one criterion marked out of 5; a missing value is a mark not given.
    // Ordinal alpha uses only the order of values, so dividing by the maximum changes nothing.
    const K = [
      [1, 2, 3, 3, 2, 1, 4, 1, 2, null, null, null],
      [1, 2, 3, 3, 2, 2, 4, 1, 2, 5, null, 3],
      [null, 3, 3, 3, 2, 3, 4, 2, 2, 5, 1, null],
      [1, 2, 3, 3, 2, 4, 4, 1, 2, 5, 1, null],
    ];
    const attempts = K.map((row) => row.flatMap((v, unit) => (v === null ? [] : [m(unit, 'evenness', v)])));
    const a = exerciseAgreement(attempts, 12, [EVEN]);
    expect(Number(a.alpha!.toFixed(3))).toBe(0.815);
    expect(a).toMatchObject({ examiners: 4, units: 12, level: 'ordinal' });
    // Krippendorff (2004): α ≥ 0.800 reliable; 0.667–0.800 tentative conclusions only.
    expect(a.interpretation).toEqual({ label: 'reliable', source: KRIPPENDORFF_2004.source });
  });
  it('one examiner: no alpha, and says why', () => {
    const a = exerciseAgreement([[m(0, 'accuracy', 5)]], 1, [ACC]);
    expect(a.alpha).toBeNull();
    expect(a.note).toMatch(/at least two/);
  });
  it('criteria on different scales meet on one scale: 8/10 and 4/5 are the same value', () => {
    // Two examiners, identical shares on both criteria but for one cell → alpha < 1 and defined.
    const a = exerciseAgreement(
      [
        [m(0, 'accuracy', 8), m(0, 'evenness', 4), m(1, 'accuracy', 4), m(1, 'evenness', 1)],
        [m(0, 'accuracy', 8), m(0, 'evenness', 4), m(1, 'accuracy', 4), m(1, 'evenness', 2)],
      ],
      2,
      [ACC, EVEN],
    );
    expect(a.alpha).not.toBeNull();
    expect(a.alpha!).toBeLessThan(1);
    expect(a.alpha!).toBeGreaterThan(0.5);
  });
});
