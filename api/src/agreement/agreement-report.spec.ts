import { describe, expect, it } from 'vitest';
import { icc, KOO_LI_2016, LANDIS_KOCH_1977 } from '@stavemark/shared';
import { buildAgreementReport, chooseIccForm, type ScoredPair } from './agreement-report.js';

const A = { id: 'a', name: 'Ada' };
const B = { id: 'b', name: 'Bea' };
const C = { id: 'c', name: 'Cal' };
type Ex = typeof A;

const pair = (i: number, x: Ex, px: number, y: Ex, py: number, bx = 0, by = 0): ScoredPair => ({
  slotId: `slot-${i}`,
  first: { examiner: x, percent: px, bandRank: bx },
  second: { examiner: y, percent: py, bandRank: by },
});
const report = (pairs: ScoredPair[], bandLevels = 4) =>
  buildAgreementReport({
    scope: { kind: 'sitting', id: 's', title: 'T', from: '2026-01-01', to: '2026-01-01' },
    sittings: [],
    counts: { doubleMarkedSlots: pairs.length, notCompleted: 0, notSubmitted: 0 },
    pairs,
    bandLevels,
  });

// Hand-worked table (ours): three candidates, totals (2, 1), (4, 4), (6, 4).
// Grand mean 3.5; row means 1.5, 4, 5 → SSR = 2·(4 + 0.25 + 2.25) = 13; column means 4, 3 →
// SSC = 3·(0.25 + 0.25) = 1.5; SST = 15.5 → SSE = 1. BMS = 6.5, WMS = 2.5/3, JMS = 1.5, EMS = 0.5.
// ICC(1,1) = (6.5 − 5/6)/(6.5 + 5/6) = 17/22 = 0.773; ICC(2,1) = 6/(7 + 2·1/3) = 18/23 = 0.783.
const TABLE: [number, number][] = [
  [2, 1],
  [4, 4],
  [6, 4],
];

describe('ICC form (design.md §4.5: Shrout & Fleiss 1979 cases 1 and 2)', () => {
  it('the same two examiners on every candidate → ICC(2,1), whoever marked first', () => {
    // Bea is first marker on the second candidate: the columns still follow the examiner.
    const pairs = [pair(0, A, 2, B, 1), pair(1, B, 4, A, 4), pair(2, A, 6, B, 4)];
    expect(chooseIccForm(pairs).form).toBe('ICC(2,1)');
    const r = report(pairs);
    expect(r.icc.form).toBe('ICC(2,1)');
    expect(r.icc.formReason).toMatch(/Ada and Bea/);
    expect(r.icc.value).toBeCloseTo(18 / 23, 10);
    expect(Number(r.icc.value!.toFixed(3))).toBe(0.783);
    // The assembly passes the table to the shared icc() unchanged (that function is checked
    // against Shrout & Fleiss 1979 Table 4 in shared/src/stats/icc.test.ts).
    const direct = icc(TABLE, 'ICC(2,1)');
    expect(r.icc.lower).toBeCloseTo(direct.lower, 12);
    expect(r.icc.upper).toBeCloseTo(direct.upper, 12);
  });

  it('pairs that vary → ICC(1,1), the one-way model', () => {
    const pairs = [pair(0, A, 2, B, 1), pair(1, A, 4, C, 4), pair(2, B, 6, C, 4)];
    expect(chooseIccForm(pairs).form).toBe('ICC(1,1)');
    const r = report(pairs);
    expect(r.icc.form).toBe('ICC(1,1)');
    expect(r.icc.formReason).toMatch(/3 different pairs/);
    expect(r.icc.value).toBeCloseTo(17 / 22, 10);
    expect(Number(r.icc.value!.toFixed(3))).toBe(0.773);
  });
});

describe('the 30-candidate threshold (design.md §4.5)', () => {
  // The hand-worked table ten times over: SSR = 130, SSC = 15, SST = 155, SSE = 10;
  // BMS = 130/29, WMS = 25/30, EMS = 10/29, JMS = 15.
  // ICC(1,1) = (780 − 145)/(780 + 145) = 127/185 = 0.686; ICC(2,1) = 360/505 = 72/101 = 0.713.
  const thirty = Array.from({ length: 30 }, (_, i) => TABLE[i % 3]!);
  const varying = (rows: [number, number][]) =>
    rows.map(([x, y], i) => pair(i, [A, B, C][i % 3]!, x, [B, C, A][i % 3]!, y));

  it('below 30 candidates: the value and interval, but “too few to judge” and no interpretation', () => {
    const r = report(varying(thirty.slice(0, 29)));
    expect(r.icc.n).toBe(29);
    expect(r.icc.enough).toBe(false);
    expect(r.icc.value).not.toBeNull();
    expect(r.icc.interpretation).toBeNull();
    expect(r.icc.intervalInterpretation).toBeNull();
    expect(r.icc.note).toMatch(/^Too few to judge: 29 double-marked candidates/);
  });

  it('at 30 varying pairs: ICC(1,1) = 0.686 (hand-worked), interpreted on Koo & Li (2016) with its source', () => {
    const r = report(varying(thirty));
    expect(r.icc.form).toBe('ICC(1,1)');
    expect(Number(r.icc.value!.toFixed(3))).toBe(0.686);
    expect(r.icc.value).toBeCloseTo(127 / 185, 10);
    expect(r.icc.enough).toBe(true);
    expect(r.icc.note).toBeNull();
    // Koo & Li: 0.50–0.75 moderate.
    expect(r.icc.interpretation).toEqual({ label: 'moderate', source: KOO_LI_2016.source });
    expect(r.icc.intervalInterpretation!.lower).toBe(
      r.icc.lower! < 0.5 ? 'poor' : r.icc.lower! < 0.75 ? 'moderate' : 'good',
    );
    expect(r.scales.map((s) => s.key)).toEqual(['koo_li_2016', 'landis_koch_1977']);
  });

  it('at 30 candidates of one fixed pair: ICC(2,1) = 0.713 (hand-worked)', () => {
    const r = report(thirty.map(([x, y], i) => pair(i, A, x, B, y)));
    expect(r.icc.form).toBe('ICC(2,1)');
    expect(r.icc.value).toBeCloseTo(72 / 101, 10);
    expect(Number(r.icc.value!.toFixed(3))).toBe(0.713);
    expect(r.icc.interpretation?.label).toBe('moderate');
  });

  it('no candidate, or one: no value and a plain note', () => {
    expect(report([]).icc).toMatchObject({ n: 0, value: null, note: expect.stringMatching(/No double-marked/) });
    expect(report([pair(0, A, 50, B, 60)]).icc).toMatchObject({ n: 1, value: null, note: expect.stringMatching(/Too few/) });
  });
});

describe('bands: exact and adjacent agreement, quadratic-weighted kappa per examiner pair with its n', () => {
  it('the 50-item example reproduced in the Wikipedia article "Cohen\'s kappa" (20/5/10/15): exact 0.700, κ = 0.400, n = 50', () => {
    // Two bands (pass = 1, not yet passed = 0); with two categories every weighting gives Cohen's κ.
    const cells: [number, number, number][] = [
      [1, 1, 20],
      [1, 0, 5],
      [0, 1, 10],
      [0, 0, 15],
    ];
    const pairs: ScoredPair[] = [];
    for (const [a, b, count] of cells)
      for (let i = 0; i < count; i++) pairs.push(pair(pairs.length, A, 60, B, 60, a, b));
    const r = report(pairs, 2);
    expect(r.bands.n).toBe(50);
    expect(Number(r.bands.exact!.toFixed(3))).toBe(0.7);
    expect(r.bands.adjacent).toBe(1);
    expect(r.pairs).toHaveLength(1);
    expect(r.pairs[0]!.n).toBe(50);
    expect(Number(r.pairs[0]!.kappa!.toFixed(3))).toBe(0.4);
    // Landis & Koch (1977): 0.21–0.40 fair.
    expect(r.pairs[0]!.interpretation).toEqual({ label: 'fair', source: LANDIS_KOCH_1977.source });
  });

  it('each pair has its own n; the pair counts whichever examiner marked first', () => {
    // Four bands (0..3). Ada–Bea: (0,0), (1,2), (3,3) with Bea first once; Ada–Cal: (2,1), (2,2).
    const r = report([
      pair(0, A, 40, B, 41, 0, 0),
      pair(1, B, 75, A, 65, 2, 1),
      pair(2, A, 90, B, 88, 3, 3),
      pair(3, C, 70, A, 72, 1, 2),
      pair(4, A, 72, C, 73, 2, 2),
    ]);
    const ab = r.pairs.find((p) => p.examiners.map((e) => e.id).join() === 'a,b')!;
    const ac = r.pairs.find((p) => p.examiners.map((e) => e.id).join() === 'a,c')!;
    expect(ab.n).toBe(3);
    expect(ac.n).toBe(2);
    // Ada–Bea by hand, quadratic weights 1 − (i−j)²/9 on bands 0..3:
    // observed: (1 + 8/9 + 1)/3 = 26/27; Ada's bands 0,1,3 and Bea's 0,2,3 each 1/3;
    // expected = Σ w(i,j)/9 over i∈{0,1,3}, j∈{0,2,3}:
    //   i=0: 1 + 5/9 + 0 = 14/9; i=1: 8/9 + 8/9 + 5/9 = 21/9; i=3: 0 + 8/9 + 1 = 17/9 → 52/81.
    // κ = (26/27 − 52/81)/(1 − 52/81) = (78 − 52)/(81 − 52) = 26/29 = 0.897.
    expect(ab.kappa).toBeCloseTo(26 / 29, 10);
    expect(ab.enough).toBe(false);
    expect(ab.interpretation).toBeNull();
    expect(ab.note).toMatch(/Too few to judge: 3/);
    // Exact: 3 of 5 (0/0, 3/3, 2/2); adjacent: all 5.
    expect(r.bands).toMatchObject({ n: 5, exact: 0.6, adjacent: 1 });
  });

  it('a pair that used one band only gets no kappa, with the reason', () => {
    const r = report([pair(0, A, 60, B, 62, 1, 1), pair(1, A, 61, B, 63, 1, 1)], 1);
    expect(r.pairs[0]!.kappa).toBeNull();
    expect(r.pairs[0]!.note).toMatch(/No kappa/);
  });
});

describe('severity against the other marker, shown from 20 sheets (design.md §4.5)', () => {
  // Ada marks 1 or 3 points below Bea, alternately: differences −1, −3, …
  const rows = (n: number) => Array.from({ length: n }, (_, i) => pair(i, A, 50 + i, B, 50 + i + (i % 2 ? 3 : 1)));

  it('19 sheets: hidden, with the count so far', () => {
    const r = report(rows(19));
    const ada = r.severity.find((s) => s.examiner.id === 'a')!;
    expect(ada).toMatchObject({ n: 19, shown: false, meanDifference: null, standardError: null });
    expect(ada.note).toMatch(/from 20 .* 19 so far/);
  });

  it('20 sheets: mean −2.000, SE 0.229, 95 % t interval, “more severe”; the other marker the mirror image', () => {
    // Hand-worked: mean −2; deviations ±1 → sd = √(20/19) = 1.0260; SE = sd/√20 = 0.2294.
    // t(0.975, 19) = 2.093 (Student's t table, e.g. NIST/SEMATECH e-Handbook §1.3.6.7.2).
    const r = report(rows(20));
    const ada = r.severity.find((s) => s.examiner.id === 'a')!;
    const bea = r.severity.find((s) => s.examiner.id === 'b')!;
    expect(ada.shown).toBe(true);
    expect(Number(ada.meanDifference!.toFixed(3))).toBe(-2);
    expect(Number(ada.standardError!.toFixed(3))).toBe(0.229);
    expect(ada.lower).toBeCloseTo(-2 - 2.093 * Math.sqrt(20 / 19 / 20), 3);
    expect(ada.upper).toBeCloseTo(-2 + 2.093 * Math.sqrt(20 / 19 / 20), 3);
    expect(ada.reading).toBe('more severe');
    expect(bea).toMatchObject({ n: 20, shown: true, reading: 'more lenient' });
    expect(bea.meanDifference).toBeCloseTo(2, 12);
  });

  it('in varying pairs each examiner counts their own sheets', () => {
    const pairs = [
      ...Array.from({ length: 12 }, (_, i) => pair(i, A, 60, B, 60 + (i % 3))),
      ...Array.from({ length: 9 }, (_, i) => pair(12 + i, C, 61, A, 60 + (i % 2))),
    ];
    const r = report(pairs);
    expect(r.severity.map((s) => [s.examiner.id, s.n, s.shown])).toEqual([
      ['a', 21, true],
      ['b', 12, false],
      ['c', 9, false],
    ]);
    // Ada: 12 pairs with Bea, differences 0, −1, −2 (mean −1), and 9 with Cal, differences
    // −1, 0, … (five −1, four 0): total (−12 − 5)/21 = −17/21.
    expect(r.severity[0]!.meanDifference).toBeCloseTo(-17 / 21, 12);
    expect(r.severity[0]!.reading).toBe('more severe');
  });
});
