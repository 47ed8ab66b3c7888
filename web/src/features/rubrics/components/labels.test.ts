import { describe, expect, it } from 'vitest';
import {
  formatWeightShare,
  isTensionCriterion,
  keyFromLabel,
  spreadBands,
  undescribedMarks,
} from './labels';

describe('rubric form helpers', () => {
  it('spreads levels over 0..max with sizes differing by at most one (worked by hand)', () => {
    // 11 marks (0–10) in 3 levels: 4 + 4 + 3.
    expect(spreadBands(10, 3)).toEqual([
      { min: 0, max: 3 },
      { min: 4, max: 7 },
      { min: 8, max: 10 },
    ]);
    // 6 marks (0–5) in 5 levels: 2 + 1 + 1 + 1 + 1.
    expect(spreadBands(5, 5)).toEqual([
      { min: 0, max: 1 },
      { min: 2, max: 2 },
      { min: 3, max: 3 },
      { min: 4, max: 4 },
      { min: 5, max: 5 },
    ]);
    // More levels than marks: one per mark.
    expect(spreadBands(1, 4)).toEqual([
      { min: 0, max: 0 },
      { min: 1, max: 1 },
    ]);
  });

  it('lists the marks no descriptor covers', () => {
    expect(
      undescribedMarks(5, [
        { min: 1, max: 3 },
        { min: 5, max: 5 },
      ]),
    ).toEqual([0, 4]);
    expect(undescribedMarks(3, [{ min: 0, max: 3 }])).toEqual([]);
    expect(undescribedMarks(Number.NaN, [])).toEqual([]);
  });

  it('suggests a criterion key from its label', () => {
    expect(keyFromLabel('Note accuracy')).toBe('note_accuracy');
    expect(keyFromLabel('Tone & dynamics')).toBe('tone_dynamics');
    expect(keyFromLabel('3rds: évenness')).toBe('rds_evenness');
    expect(keyFromLabel('')).toBe('');
  });

  it('finds the tension criterion by key or label, and shows weight shares', () => {
    expect(isTensionCriterion({ key: 'freedom_from_tension', label: 'Freedom' })).toBe(true);
    expect(isTensionCriterion({ key: 'relaxation', label: 'Free of Tension' })).toBe(true);
    expect(isTensionCriterion({ key: 'evenness', label: 'Evenness' })).toBe(false);
    expect(formatWeightShare(3, 6)).toBe('50 %');
    expect(formatWeightShare(1, 6)).toBe('17 %');
    expect(formatWeightShare(0, 6)).toBe('—');
  });
});
