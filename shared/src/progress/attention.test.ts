import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { isTensionCriterion, persistentLow, risingSlipRate } from './attention.js';

// The thresholds are this product's own rule (attention.ts); the slope is checked against
// simple-statistics' linearRegression, the rest is hand-worked.
const p = (id: string, date: string, fraction: number) => ({ sittingId: id, date, fraction });

describe('persistentLow', () => {
  it('3 of the latest 4 below 60 %, the latest among them → the low sittings', () => {
    const r = persistentLow([
      p('a', '2026-01-10', 0.4),
      p('b', '2026-02-10', 0.8),
      p('c', '2026-03-10', 0.5),
      p('d', '2026-04-10', 0.4),
      p('e', '2026-05-10', 0.55),
    ]);
    expect(r?.map((x) => x.sittingId)).toEqual(['c', 'd', 'e']);
  });
  it('a good latest sitting, or only 2 low of 4, is not persistent; 60 % exactly is not low', () => {
    expect(persistentLow([p('a', '2026-01-10', 0.4), p('b', '2026-02-10', 0.4), p('c', '2026-03-10', 0.4), p('d', '2026-04-10', 0.6)])).toBeNull();
    expect(persistentLow([p('a', '2026-01-10', 0.8), p('b', '2026-02-10', 0.4), p('c', '2026-03-10', 0.9), p('d', '2026-04-10', 0.4)])).toBeNull();
    expect(persistentLow([p('a', '2026-01-10', 0.4), p('b', '2026-02-10', 0.4)])).toBeNull();
  });
});

describe('risingSlipRate', () => {
  const s = (id: string, date: string, slips: number, notesPlayed = 200) => ({ sittingId: id, date, slips, notesPlayed });
  it('1 → 2.5 → 4 → 6 per 100 notes, 30 days apart: rising, slope as simple-statistics gives', () => {
    const pts = [s('a', '2026-01-01', 2), s('b', '2026-01-31', 5), s('c', '2026-03-02', 8), s('d', '2026-04-01', 12)];
    const r = risingSlipRate(pts)!;
    expect(r.points.map((x) => x.rate)).toEqual([1, 2.5, 4, 6]);
    const { m } = linearRegression([[0, 1], [1, 2.5], [2, 4], [3, 6]]); // x in 30-day steps
    expect(r.slopePer30Days).toBeCloseTo(m, 10);
    expect(r).toMatchObject({ first: 1, latest: 6 });
  });
  it('only the latest 4 count; a flat, falling or small rise is not listed; fewer than 3 → null', () => {
    const old = s('z', '2025-06-01', 40); // a bad day long ago is outside the window
    expect(risingSlipRate([old, s('a', '2026-01-01', 2), s('b', '2026-01-31', 5), s('c', '2026-03-02', 8), s('d', '2026-04-01', 12)])?.first).toBe(1);
    expect(risingSlipRate([s('a', '2026-01-01', 6), s('b', '2026-01-31', 6), s('c', '2026-03-02', 6)])).toBeNull();
    expect(risingSlipRate([s('a', '2026-01-01', 12), s('b', '2026-01-31', 8), s('c', '2026-03-02', 4)])).toBeNull();
    // 0.5 → 1.5 per 100 notes triples, but stays under 2 per 100 notes
    expect(risingSlipRate([s('a', '2026-01-01', 1), s('b', '2026-01-31', 2), s('c', '2026-03-02', 3)])).toBeNull();
    expect(risingSlipRate([s('a', '2026-01-01', 2), s('b', '2026-01-31', 9)])).toBeNull();
    // sittings with no counted notes (passages only) are skipped
    expect(risingSlipRate([s('a', '2026-01-01', 0, 0), s('b', '2026-01-31', 9), s('c', '2026-03-02', 9)])).toBeNull();
  });
});

describe('isTensionCriterion', () => {
  it('by key or label', () => {
    expect(isTensionCriterion({ key: 'freedom_from_tension' })).toBe(true);
    expect(isTensionCriterion({ key: 'ease', label: 'Free of tension' })).toBe(true);
    expect(isTensionCriterion({ key: 'evenness', label: 'Evenness' })).toBe(false);
  });
});
