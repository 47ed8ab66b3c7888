import { linearRegression, quantileRank } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  MIN_STUDENTS_FOR_PERCENTILE,
  percentileFromCounts,
  percentileInGrade,
  splitComparable,
  trend,
  type ProgressPoint,
} from './trend.js';

// Hand-worked: sittings 30 days apart with 50, 56, 58, 66 %. In 30-day units x = 0..3:
// Sxx = 5, Sxy = 25 → slope 5 per 30 days, intercept 50; residuals 0, 1, −2, 1 → SSE = 6;
// SE = √(6 / 2 / 5) = √0.6 = 0.7746.
const points: ProgressPoint[] = [
  { date: '2026-01-05', percent: 50 },
  { date: '2026-02-04', percent: 56 },
  { date: '2026-03-06', percent: 58 },
  { date: '2026-04-05', percent: 66 },
];

describe('trend', () => {
  it('slope 5 per 30 days with SE √0.6 (hand-worked above)', () => {
    const t = trend(points);
    expect(t.n).toBe(4);
    expect(t.slopePer30Days).toBeCloseTo(5, 10);
    expect(t.intercept).toBeCloseTo(50, 10);
    expect(t.standardError).toBeCloseTo(Math.sqrt(0.6), 10);
    expect(t.firstToLatest).toEqual({ first: 50, latest: 66, change: 16 });
  });
  it('slope agrees with simple-statistics linearRegression on irregular dates', () => {
    const irregular: ProgressPoint[] = [
      { date: '2025-09-15', percent: 48 },
      { date: '2025-10-20', percent: 55 },
      { date: '2025-12-01', percent: 51 },
      { date: '2026-02-11', percent: 63 },
      { date: '2026-05-30', percent: 70 },
    ];
    const t0 = Date.parse('2025-09-15');
    const { m } = linearRegression(
      irregular.map((p) => [(Date.parse(p.date as string) - t0) / 86_400_000, p.percent]),
    );
    expect(trend(irregular).slopePer30Days).toBeCloseTo(m * 30, 10);
  });
  it('absent sittings stay out; the order of input does not matter', () => {
    const withAbsent = [...points]
      .reverse()
      .concat([{ date: '2026-03-20', percent: 0, outcome: 'absent' }]);
    expect(trend(withAbsent).slopePer30Days).toBeCloseTo(5, 10);
    expect(trend(withAbsent).n).toBe(4);
  });
  it('too few points: no slope below 2, no SE below 3', () => {
    expect(trend(points.slice(0, 1))).toMatchObject({
      slopePer30Days: null,
      standardError: null,
      firstToLatest: { change: 0 },
    });
    expect(trend(points.slice(0, 2)).standardError).toBeNull();
    expect(trend([])).toMatchObject({ n: 0, firstToLatest: null });
  });
  it('refuses bad dates and percentages', () => {
    expect(() => trend([{ date: 'yesterday', percent: 50 }])).toThrow(/not a date/);
    expect(() => trend([{ date: '2026-01-01', percent: 120 }])).toThrow(/0..100/);
  });
  it('a change of grade starts a new comparable line', () => {
    const lines = splitComparable([
      { date: '2026-01-01', percent: 50, lineageId: 'L', grade: '3' },
      { date: '2026-02-01', percent: 60, lineageId: 'L', grade: '3' },
      { date: '2026-03-01', percent: 40, lineageId: 'L', grade: '4' },
    ]);
    expect(lines.map((l) => l.length)).toEqual([2, 1]);
  });
});

describe('percentileInGrade', () => {
  const grade = [42, 55, 61, 61, 67, 70, 73, 78, 81, 90, 95];
  it('agrees with simple-statistics quantileRank (× 100), with and without ties', () => {
    for (const v of [61, 70, 95, 42, 65, 30, 99])
      expect(percentileInGrade(v, grade)).toBeCloseTo(quantileRank(grade, v) * 100, 10);
  });
  it(`is hidden (null) below ${MIN_STUDENTS_FOR_PERCENTILE} students (design.md §4.6)`, () => {
    expect(percentileInGrade(70, grade.slice(0, 9))).toBeNull();
    expect(percentileInGrade(70, grade.slice(0, 10))).not.toBeNull();
  });
});

describe('percentileFromCounts', () => {
  const grade = [42, 55, 61, 61, 67, 70, 73, 78, 81, 90, 95];
  const counts = (v: number) => ({
    below: grade.filter((x) => x < v).length,
    equal: grade.filter((x) => x === v).length,
    n: grade.length,
  });
  it('agrees with simple-statistics quantileRank (× 100) from the counts alone', () => {
    for (const v of [61, 70, 95, 42, 65, 30, 99])
      expect(percentileFromCounts(counts(v))).toBeCloseTo(quantileRank(grade, v) * 100, 10);
  });
  it(`is hidden (null) below ${MIN_STUDENTS_FOR_PERCENTILE} students and refuses impossible counts`, () => {
    expect(percentileFromCounts({ below: 3, equal: 1, n: 9 })).toBeNull();
    expect(() => percentileFromCounts({ below: 8, equal: 4, n: 10 })).toThrow(RangeError);
    expect(() => percentileFromCounts({ below: 1.5, equal: 0, n: 10 })).toThrow(RangeError);
  });
});
