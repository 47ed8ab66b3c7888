import { describe, expect, it } from 'vitest';
import { allocateSecondMarkers, pairKey, spreadIndices, type DoubleMarkSlot } from './double-marking.js';

const slot = (id: string, primaryId: string | null, teachers: string[] = [], busy: string[] = []): DoubleMarkSlot => ({
  id,
  primaryId,
  teachers: new Set(teachers),
  busy: new Set(busy),
});

function pairCounts(assigned: { slotId: string; secondId: string | null }[], slots: DoubleMarkSlot[]): Map<string, number> {
  const m = new Map<string, number>();
  for (const a of assigned) {
    const p = slots.find((s) => s.id === a.slotId)!.primaryId!;
    if (a.secondId) m.set(pairKey(p, a.secondId), (m.get(pairKey(p, a.secondId)) ?? 0) + 1);
  }
  return m;
}

describe('spreadIndices (hand-worked)', () => {
  it('picks the middle of each equal run of the day', () => {
    // n = 10, 30 % → 3 slots: ⌊0.5·10/3⌋ = 1, ⌊1.5·10/3⌋ = 5, ⌊2.5·10/3⌋ = 8
    expect(spreadIndices(10, 30)).toEqual([1, 5, 8]);
    expect(spreadIndices(10, 100)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    // any share above 0 double-marks at least one slot; 0 % none
    expect(spreadIndices(7, 1)).toEqual([3]);
    expect(spreadIndices(7, 0)).toEqual([]);
    expect(spreadIndices(0, 50)).toEqual([]);
  });
});

describe('allocateSecondMarkers', () => {
  it('one lead and three others: each second-marks three of nine (hand-worked)', () => {
    const slots = Array.from({ length: 9 }, (_, i) => slot(`s${i}`, 'A'));
    const out = allocateSecondMarkers(slots, ['A', 'B', 'C', 'D']);
    expect(out.map((a) => a.secondId)).toEqual(['B', 'C', 'D', 'B', 'C', 'D', 'B', 'C', 'D']);
  });

  it('rotating leads: every pair marks together equally (hand-worked: AB, BC, CA twice each)', () => {
    const slots = ['A', 'B', 'C', 'A', 'B', 'C'].map((p, i) => slot(`s${i}`, p));
    const out = allocateSecondMarkers(slots, ['A', 'B', 'C']);
    expect(out.map((a) => a.secondId)).toEqual(['B', 'C', 'A', 'B', 'C', 'A']);
    expect([...pairCounts(out, slots).values()]).toEqual([2, 2, 2]);
  });

  it('pairs stay within one of each other for many panels and leads (property over 200 cases)', () => {
    let seed = 7;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    for (let c = 0; c < 200; c++) {
      const panel = ['A', 'B', 'C', 'D', 'E'].slice(0, 2 + Math.floor(rand() * 4));
      const lead = panel[0]!;
      const n = 1 + Math.floor(rand() * 30);
      const slots = Array.from({ length: n }, (_, i) => slot(`s${i}`, lead));
      const counts = [...pairCounts(allocateSecondMarkers(slots, panel), slots).values()];
      expect(Math.max(...counts) - Math.min(...counts, Math.max(...counts))).toBeLessThanOrEqual(1);
      if (n >= panel.length - 1) expect(counts).toHaveLength(panel.length - 1);
    }
  });

  it('avoids an examiner who teaches the candidate while anyone else is free', () => {
    const out = allocateSecondMarkers([slot('s0', 'A', ['B'])], ['A', 'B', 'C']);
    expect(out).toEqual([{ slotId: 's0', secondId: 'C', ownPupil: false }]);
  });

  it('gives an own pupil only when nobody else is free, and says so', () => {
    const out = allocateSecondMarkers([slot('s0', 'A', ['B'], ['C'])], ['A', 'B', 'C']);
    expect(out).toEqual([{ slotId: 's0', secondId: 'B', ownPupil: true }]);
  });

  it('never picks the first examiner or someone busy elsewhere; reports when nobody is free', () => {
    const out = allocateSecondMarkers([slot('s0', 'A', [], ['B']), slot('s1', null)], ['A', 'B']);
    expect(out).toEqual([
      { slotId: 's0', secondId: null, ownPupil: false, reason: 'nobody_free' },
      { slotId: 's1', secondId: null, ownPupil: false, reason: 'no_primary' },
    ]);
  });

  it('breaks ties with earlier sittings, so the same two do not pair every time', () => {
    const history = new Map([[pairKey('A', 'B'), 4]]);
    const out = allocateSecondMarkers([slot('s0', 'A')], ['A', 'B', 'C'], history);
    expect(out[0]!.secondId).toBe('C');
  });
});
