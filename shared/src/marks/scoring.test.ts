import { describe, expect, it } from 'vitest';
import { bandFor, bandOrder, bandPolicyBodySchema, DEFAULT_BAND_POLICY } from './bands.js';
import { MarkSheetError, scoreMarkSheet, type SheetRequestInput } from './scoring.js';

const criteria = [
  { key: 'accuracy', label: 'Note accuracy', weight: 2, maxMark: 5 },
  { key: 'evenness', label: 'Evenness', weight: 1, maxMark: 5 },
  { key: 'tension', label: 'Freedom from tension', weight: 1, maxMark: 10 },
];
const req = (
  key: string,
  difficultyWeight: number,
  a: number,
  e: number,
  t: number,
): SheetRequestInput => ({
  key,
  asked: true,
  difficultyWeight,
  criteria,
  marks: { accuracy: a, evenness: e, tension: t },
});
// Hand-worked example (ours, on paper):
//   r1: 4/5, 3/5, 6/10 → (2·0.8 + 0.6 + 0.6)/4 = 0.7
//   r2: 5/5, 5/5, 10/10 → 1.0
//   r3: 3/5, 2/5, 5/10 → (2·0.6 + 0.4 + 0.5)/4 = 0.525
//   by difficulty (1, 1, 2): (0.7 + 1.0 + 2·0.525)/4 = 0.6875 × 30 = 20.625 → 21 of 30 = 70 % → Merit
//   equal weights: (0.7 + 1.0 + 0.525)/3 = 0.741 6̅ × 30 = 22.25 → 22 → 73.3 % → Merit
const requests = [req('r1', 1, 4, 3, 6), req('r2', 1, 5, 5, 10), req('r3', 2, 3, 2, 5)];

describe('scoreMarkSheet (hand-worked example above)', () => {
  it('weights requests by difficulty, rounds half up, bands on the rounded total', () => {
    const s = scoreMarkSheet({ outcome: 'completed', totalMarks: 30, requests });
    if (s.status !== 'scored') throw new Error('expected a score');
    [0.7, 1, 0.525].forEach((v, i) => expect(s.requests[i]?.score).toBeCloseTo(v, 12));
    expect(s.exactTotal).toBeCloseTo(20.625, 10);
    expect(s.total).toBe(21);
    expect(s.percentage).toBeCloseTo(70, 10);
    expect(s.band).toEqual({ key: 'merit', label: 'Merit' });
    [7.5, 7.5, 15].forEach((v, i) => expect(s.requests[i]?.maximum).toBeCloseTo(v, 12));
    expect(s.requests[0]).toMatchObject({ rawMarks: 13, rawMaximum: 20 });
  });
  it('equal weighting gives 22.25 → 22', () => {
    const s = scoreMarkSheet({
      outcome: 'completed',
      totalMarks: 30,
      requests,
      weighting: 'equal',
    });
    expect(s.status === 'scored' && s.total).toBe(22);
  });
  it('a request not asked is excluded (same total as without it)', () => {
    const notAsked: SheetRequestInput = {
      key: 'r4',
      asked: false,
      difficultyWeight: 3,
      criteria,
      marks: {},
    };
    const s = scoreMarkSheet({
      outcome: 'completed',
      totalMarks: 30,
      requests: [...requests, notAsked],
    });
    if (s.status !== 'scored') throw new Error('expected a score');
    expect(s.total).toBe(21);
    expect(s.notAsked).toEqual(['r4']);
    expect(s.requests).toHaveLength(3);
  });
  it('a tie at .5 rounds up: one criterion 1/4 of 10 marks = 2.5 → 3 (hand-worked)', () => {
    const s = scoreMarkSheet({
      outcome: 'completed',
      totalMarks: 10,
      requests: [
        {
          key: 'r1',
          asked: true,
          difficultyWeight: 1,
          criteria: [{ key: 'c', label: 'C', weight: 1, maxMark: 4 }],
          marks: { c: 1 },
        },
      ],
    });
    expect(s.status === 'scored' && [s.total, s.band.key]).toEqual([3, 'not_yet_passed']);
  });
  it('a perfect sheet is exactly the total marks', () => {
    const perfect = [req('a', 1.3, 5, 5, 10), req('b', 0.7, 5, 5, 10), req('c', 2.9, 5, 5, 10)];
    const s = scoreMarkSheet({ outcome: 'completed', totalMarks: 7, requests: perfect });
    expect(s.status === 'scored' && [s.total, s.band.key]).toEqual([7, 'distinction']);
  });
  it('absent, withdrawn and incomplete slots give no result', () => {
    for (const outcome of ['absent', 'withdrawn', 'incomplete'] as const) {
      expect(scoreMarkSheet({ outcome, totalMarks: 30, requests })).toEqual({
        status: 'no_result',
        outcome,
      });
    }
  });
  it('per-criterion profile: marks out of maxima over asked requests', () => {
    const s = scoreMarkSheet({ outcome: 'completed', totalMarks: 30, requests });
    if (s.status !== 'scored') throw new Error('expected a score');
    expect(s.profile.map((p) => [p.key, p.marks, p.maximum, p.requests])).toEqual([
      ['accuracy', 12, 15, 3],
      ['evenness', 10, 15, 3],
      ['tension', 21, 30, 3],
    ]);
    expect(s.profile[2]?.fraction).toBeCloseTo(0.7, 12);
  });
  it('lists every missing or invalid mark of an asked request', () => {
    const bad: SheetRequestInput = {
      key: 'r9',
      asked: true,
      difficultyWeight: 1,
      criteria,
      marks: { accuracy: 6, evenness: 2.5 },
    };
    try {
      scoreMarkSheet({ outcome: 'completed', totalMarks: 30, requests: [bad] });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(MarkSheetError);
      expect((e as MarkSheetError).details.map((d) => d.path)).toEqual([
        'r9.accuracy',
        'r9.evenness',
        'r9.tension',
      ]);
    }
  });
  it('refuses a sheet with nothing asked', () => {
    expect(() =>
      scoreMarkSheet({
        outcome: 'completed',
        totalMarks: 30,
        requests: [{ ...requests[0]!, asked: false }],
      }),
    ).toThrow(/nothing to score/);
  });
});

describe('bandFor with the default policy (design.md §4.1 thresholds; worked table out of 70)', () => {
  const table: [number, string][] = [
    [70, 'distinction'],
    [56, 'distinction'], // 80 % exactly
    [55, 'merit'], // 78.6 %
    [49, 'merit'], // 70 % exactly
    [48, 'pass'], // 68.6 %
    [39, 'pass'], // 55.7 %
    [38, 'not_yet_passed'], // 54.3 %
    [0, 'not_yet_passed'],
  ];
  it.each(table)('%d of 70 → %s', (total, key) => {
    expect(bandFor(total, DEFAULT_BAND_POLICY, 70).key).toBe(key);
  });
  it('boundaries out of 20: 16 distinction, 14 merit, 11 pass (55 %), 10 not yet', () => {
    expect([16, 15, 14, 11, 10].map((t) => bandFor(t, DEFAULT_BAND_POLICY, 20).key)).toEqual([
      'distinction',
      'merit',
      'merit',
      'pass',
      'not_yet_passed',
    ]);
  });
  it('rejects a total outside 0..outOf', () => {
    expect(() => bandFor(71, DEFAULT_BAND_POLICY, 70)).toThrow(/between/);
    expect(() => bandFor(1, DEFAULT_BAND_POLICY, 0)).toThrow(/outOf/);
  });
  it('band order runs low to high', () => {
    expect(bandOrder(DEFAULT_BAND_POLICY)).toEqual([
      'not_yet_passed',
      'pass',
      'merit',
      'distinction',
    ]);
  });
  it('the policy schema accepts the default and refuses unordered thresholds', () => {
    expect(
      bandPolicyBodySchema.safeParse({
        bands: DEFAULT_BAND_POLICY.bands,
        below: DEFAULT_BAND_POLICY.below,
      }).success,
    ).toBe(true);
    const r = bandPolicyBodySchema.safeParse({
      bands: [DEFAULT_BAND_POLICY.bands[2], DEFAULT_BAND_POLICY.bands[0]],
      below: DEFAULT_BAND_POLICY.below,
    });
    expect(r.error?.issues[0]?.path).toEqual(['bands', 1, 'minPercent']);
  });
});
