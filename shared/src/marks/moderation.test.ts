import { describe, expect, it } from 'vitest';
import { compareSheets } from './moderation.js';
import { scoreMarkSheet, type SheetRequestInput } from './scoring.js';

const criteria = [{ key: 'c', label: 'C', weight: 1, maxMark: 10 }];
const sheet = (marks: number[], asked = marks.map(() => true)) => {
  const requests: SheetRequestInput[] = marks.map((m, i) => ({
    key: `r${i}`,
    asked: asked[i]!,
    difficultyWeight: 1,
    criteria,
    marks: { c: m },
  }));
  return scoreMarkSheet({ outcome: 'completed', totalMarks: 100, requests });
};

// Tolerance of design.md §4.5: a request by more than 20 % of its maximum, a total by more than 6 %.
describe('compareSheets (design.md §4.5 tolerance; hand-worked)', () => {
  it('a request 2 marks of 10 apart (exactly 20 %) is within; 3 apart (30 %) is flagged', () => {
    const r = compareSheets(sheet([5, 5, 5, 5]), sheet([7, 5, 5, 8]));
    expect(r.requests.map((q) => q.flagged)).toEqual([false, false, false, true]);
    expect(r.requests[3]?.difference).toBeCloseTo(0.3, 12);
    expect(r.flagged).toBe(true);
  });
  it('totals 50 and 56 (6 of 100 = 6 %) are within; 50 and 57 are flagged', () => {
    // Four equal requests of 25 marks each, so one mark of 10 on a request is 2.5 marks in the total.
    const a = sheet([5, 5, 5, 5]); // 50
    const b = sheet([6, 6, 5, 5]); // 55 (request diff 10 % each)
    expect(compareSheets(a, b).total).toMatchObject({
      a: 50,
      b: 55,
      difference: 5,
      limit: 6,
      flagged: false,
    });
    const c = sheet([6, 6, 6, 5]); // 57.5 → 58
    expect(compareSheets(a, c).total).toMatchObject({ difference: 8, flagged: true });
    expect(compareSheets(a, c).requests.every((q) => !q.flagged)).toBe(true);
  });
  it('a request asked by one examiner only is flagged', () => {
    const r = compareSheets(sheet([5, 5, 5]), sheet([5, 5, 5], [true, true, false]));
    expect(r.requests[2]).toMatchObject({ reason: 'asked_by_one_only', flagged: true, b: null });
  });
  it('equal sheets are not flagged', () => {
    expect(compareSheets(sheet([3, 9]), sheet([3, 9])).flagged).toBe(false);
  });
  it('refuses to compare a sheet without a result', () => {
    expect(() =>
      compareSheets(
        sheet([5]),
        scoreMarkSheet({ outcome: 'absent', totalMarks: 100, requests: [] }),
      ),
    ).toThrow(/scored/);
  });
});
