import { describe, expect, it } from 'vitest';
import { TENSION_CAUTION, type ResultProfile } from '@stavemark/shared';
import { buildTakeHomeReport, levelOf, longDate, type CriterionScale } from './take-home.js';

// A five-point scale with descriptors per band of marks, like the starter rubrics.
const scale = (name: string): CriterionScale => ({
  maxMark: 5,
  descriptors: [
    { min: 0, max: 1, text: `${name} is not yet secure.` },
    { min: 2, max: 2, text: `${name} comes and goes.` },
    { min: 3, max: 3, text: `${name} is mostly steady.` },
    { min: 4, max: 4, text: `${name} is steady with one lapse.` },
    { min: 5, max: 5, text: `${name} is steady throughout.` },
  ],
});
const scales = new Map([
  ['evenness', scale('Evenness')],
  ['freedom_from_tension', scale('Ease')],
  ['tempo_control', scale('Tempo')],
]);
const profile = (e: number, t: number, p: number): ResultProfile => ({
  requests: [
    {
      index: 0,
      label: 'D major scale, hands together',
      asked: true,
      score: 0.9,
      slips: 0,
      notesPlayed: 58,
    },
    {
      index: 1,
      label: 'A minor arpeggio, right hand',
      asked: true,
      score: 0.5,
      slips: 1,
      notesPlayed: 13,
    },
  ],
  criteria: [
    { key: 'evenness', label: 'Evenness', fraction: e, marks: e * 10, maximum: 10 },
    {
      key: 'freedom_from_tension',
      label: 'Freedom from tension',
      fraction: t,
      marks: t * 10,
      maximum: 10,
    },
    { key: 'tempo_control', label: 'Tempo control', fraction: p, marks: p * 10, maximum: 10 },
  ],
});
const base = {
  resultId: 'r1',
  studentName: 'Ellis Northcott',
  sittingTitle: 'Grade 5 mock',
  dateText: 'Thursday 19 November 2026',
  bandLabel: 'Merit',
  belowEveryBand: false,
  scales,
  teacherNote: 'Keep the wrist loose.',
};

describe('levelOf (hand-worked on the scale above)', () => {
  it('rounds the mean mark half up, then reads the descriptor and the one above it', () => {
    // 0.7 × 5 = 3.5 → 4 (half up): "one lapse"; the next level is 5.
    expect(levelOf(scale('X'), 0.7)).toMatchObject({ now: { min: 4 }, next: { min: 5 } });
    // 0.3 × 5 = 1.5 → 2: "comes and goes"; next 3.
    expect(levelOf(scale('X'), 0.3)).toMatchObject({ now: { min: 2 }, next: { min: 3 } });
    // Full marks: no level above.
    expect(levelOf(scale('X'), 1).next).toBeNull();
  });
});

describe('buildTakeHomeReport', () => {
  it('names strengths (≥ 70 %) and next steps (< 70 %) from the descriptors, with the note, in words', () => {
    const r = buildTakeHomeReport({ ...base, profile: profile(0.9, 0.3, 0.7) });
    // Strengths: evenness 0.9 → 4.5 → 5, tempo 0.7 → 3.5 → 4 (ordered strongest first).
    expect(r.strengths).toEqual([
      'Evenness: Evenness is steady throughout.',
      'Tempo control: Tempo is steady with one lapse.',
    ]);
    // Next step: tension 0.3 → 2; the next level up is the 3-mark descriptor.
    expect(r.nextSteps).toEqual([
      'Freedom from tension: aim next for this — ease is mostly steady.',
    ]);
    expect(r.summary).toBe(
      'Ellis reached Merit in this mock exam. The most secure item was the D major scale, hands together; the one with most to gain from practice was the A minor arpeggio, right hand.',
    );
    expect(r.teacherNote).toBe('Keep the wrist loose.');
    // Tension appears, so the health caution of design.md §10 comes with it.
    expect(r.caution).toBe(TENSION_CAUTION);
    // Plain words: no figures in what the family reads.
    expect([r.summary, ...r.strengths, ...r.nextSteps].join(' ')).not.toMatch(/\d/);
  });

  it('always names a strength, even when nothing reached 70 %, and words the lowest band kindly', () => {
    const r = buildTakeHomeReport({
      ...base,
      bandLabel: 'Not yet passed',
      belowEveryBand: true,
      profile: profile(0.5, 0.2, 0.4),
    });
    expect(r.strengths).toEqual(['Evenness: Evenness is mostly steady.']);
    expect(r.nextSteps.map((s) => s.split(':')[0])).toEqual([
      'Freedom from tension',
      'Tempo control',
    ]);
    expect(r.summary).toMatch(
      /^Ellis has not yet reached a pass in this mock exam; the next steps below/,
    );
  });

  it('carries no caution when tension is not mentioned', () => {
    const p = profile(0.9, 0.8, 0.9);
    p.criteria = p.criteria.filter((c) => c.key !== 'freedom_from_tension');
    const r = buildTakeHomeReport({ ...base, profile: p });
    expect(r.caution).toBeNull();
    // Everything secure: the next step says so rather than inventing a weakness.
    expect(r.nextSteps).toEqual([
      'Keep the same steady practice: every area is secure at this level.',
    ]);
  });

  it('writes dates in words (checked against the calendar: 19 November 2026 is a Thursday)', () => {
    expect(longDate('2026-11-19')).toBe('Thursday, 19 November 2026');
  });
});
