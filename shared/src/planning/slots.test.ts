import { describe, expect, it } from 'vitest';
import type { RequirementLine, RequirementListVersion } from '../music/domain.js';
import {
  formatClock,
  intervalsOverlap,
  layoutSlots,
  parseClock,
  planSlot,
  planSlotMinutes,
} from './slots.js';

const common = {
  motions: [],
  articulations: [],
  dynamics: [],
  inversions: [],
  rubricVersionId: 'rv',
  difficultyWeight: 1,
} as const;
const mk = (
  l: Partial<RequirementLine> & Pick<RequirementLine, 'id' | 'kind'>,
): RequirementLine => ({
  ...common,
  motions: [],
  articulations: [],
  dynamics: [],
  inversions: [],
  keys: [],
  modes: [],
  hands: ['HT'],
  octaves: [1],
  tempo: { bpm: 60, beatUnit: 'quarter', notesPerBeat: 2 },
  ...l,
});
// Hand-worked (ours): at crotchet = 60 in quavers, 2 notes per second.
//   scale, 2 octaves up and down: 29 notes → 14.5 s; 2 different requests (C, G major HT)
//   arpeggio, 2 octaves up and down: 13 notes → 6.5 s; 2 different requests (RH, LH)
//   passage: stated 60 s; 1 request
const list: Pick<RequirementListVersion, 'lines' | 'selectionRule'> = {
  selectionRule: { count: 3, minPerKind: { scale: 1 } },
  lines: [
    mk({ id: 'sc', kind: 'scale', keys: ['C', 'G'], modes: ['major'], octaves: [1, 2] }),
    mk({
      id: 'ar',
      kind: 'arpeggio',
      keys: ['C'],
      modes: ['major'],
      hands: ['RH', 'LH'],
      octaves: [2],
    }),
    mk({ id: 'pa', kind: 'passage', titles: ['Study'], durationSeconds: 60 }),
  ],
};

describe('planSlot (hand-worked)', () => {
  it('slowest plausible selection: scale (minimum), then the passage and the other scale', () => {
    // playing 14.5 + 60 + 14.5 = 89 s; overhead 3 × 20 = 60 s; greeting 60 s → 209 s;
    // write-up 2 min → 329 s = 5.48 min → 6
    const p = planSlot(list, { writeUpGapMinutes: 2 });
    expect(p.assumed.map((a) => a.lineId)).toEqual(['sc', 'pa', 'sc']);
    expect(p.playingSeconds).toBeCloseTo(89, 10);
    expect(p.overheadSeconds).toBe(60);
    expect(p.minutes).toBe(6);
  });
  it('extra time 25 % lengthens the candidate part only: 209 × 1.25 + 120 = 381.25 s → 7 min', () => {
    const p = planSlot(list, { writeUpGapMinutes: 2, extraTimePercent: 25 });
    expect(p.extraSeconds).toBeCloseTo(52.25, 10);
    expect(p.minutes).toBe(7);
  });
  it('hands separately for scales doubles each scale: 69 + 80 + 69 + 60 + 120 = 398 s → 7 min', () => {
    const p = planSlot(list, {
      writeUpGapMinutes: 2,
      substitutions: [{ type: 'hands_separately', appliesTo: ['scale'] }],
    });
    expect(p.playingSeconds).toBeCloseTo(118, 10);
    expect(p.overheadSeconds).toBe(100);
    expect(p.minutes).toBe(7);
  });
  it('a tempo substitution slows playing: scales at 80 % take 14.5 / 0.8 = 18.125 s', () => {
    const p = planSlot(
      { selectionRule: { count: 1, minPerKind: {} }, lines: [list.lines[0]!] },
      { substitutions: [{ type: 'tempo_percent', percent: 80 }] },
    );
    expect(p.playingSeconds).toBeCloseTo(18.125, 10);
  });
  it('an exact whole minute is not rounded up: 60 + 20 + 40 = 120 s → 2 min', () => {
    const one = { selectionRule: { count: 1, minPerKind: {} }, lines: [list.lines[2]!] };
    expect(planSlotMinutes(one, { greetingSeconds: 40 })).toBe(2);
    expect(planSlotMinutes(one, { greetingSeconds: 41 })).toBe(3);
  });
  it('names the line when a passage has no duration, and refuses an impossible rule', () => {
    const bad = {
      selectionRule: { count: 1, minPerKind: {} },
      lines: [mk({ id: 'p2', kind: 'passage', label: 'Study in G', titles: ['x'] })],
    };
    expect(() => planSlotMinutes(bad)).toThrow(/Study in G/);
    expect(() => planSlotMinutes({ ...list, selectionRule: { count: 9, minPerKind: {} } })).toThrow(
      /offers 5/,
    );
    expect(() => planSlotMinutes(list, { extraTimePercent: -5 })).toThrow(/extraTimePercent/);
  });
});

describe('layoutSlots (hand-worked day)', () => {
  it('lays 15-minute slots from 09:00, skips the 10:30–10:45 break, applies extra time, stops at the day end', () => {
    const r = layoutSlots({
      dayStart: '09:00',
      dayEnd: '11:15',
      slotMinutes: 15,
      breaks: [{ start: '10:30', end: '10:45' }],
      candidates: [
        ...['a', 'b', 'c', 'd', 'e', 'f', 'g'].map((id) => ({ id })),
        { id: 'h', extraTimePercent: 25 },
        { id: 'i' },
      ],
    });
    expect(r.slots.map((s) => `${s.id} ${s.startTime}-${s.endTime}`)).toEqual([
      'a 09:00-09:15',
      'b 09:15-09:30',
      'c 09:30-09:45',
      'd 09:45-10:00',
      'e 10:00-10:15',
      'f 10:15-10:30',
      'g 10:45-11:00',
    ]);
    // h: 15 × 1.25 = 18.75 → 19 min, 11:00–11:19 is past 11:15; i keeps its place behind h.
    expect(r.unplaced).toEqual(['h', 'i']);
  });
  it('a slot that would straddle a break moves after it; extra time and rest breaks lengthen slots', () => {
    const r = layoutSlots({
      dayStart: 540,
      slotMinutes: 20,
      changeoverMinutes: 5,
      breaks: [{ start: '10:30', end: '10:45' }],
      candidates: [
        { id: 'a' },
        { id: 'b', extraTimePercent: 10 },
        { id: 'c', restBreakMinutes: 5 },
        { id: 'd', slotMinutes: 30 },
      ],
    });
    // a 09:00–09:20; b 22 min 09:25–09:47; c 25 min 09:52–10:17; d 30 min from 10:22 would cross 10:30 → 10:45–11:15
    expect(r.slots.map((s) => [s.startTime, s.endTime, s.minutes])).toEqual([
      ['09:00', '09:20', 20],
      ['09:25', '09:47', 22],
      ['09:52', '10:17', 25],
      ['10:45', '11:15', 30],
    ]);
    for (const s of r.slots)
      expect(intervalsOverlap(s, { start: parseClock('10:30'), end: parseClock('10:45') })).toBe(
        false,
      );
  });
  it('refuses bad input with a clear message', () => {
    expect(() => layoutSlots({ dayStart: '9.00', slotMinutes: 15, candidates: [] })).toThrow(
      /HH:MM/,
    );
    expect(() =>
      layoutSlots({ dayStart: '09:00', dayEnd: '08:00', slotMinutes: 15, candidates: [] }),
    ).toThrow(/end after/);
    expect(() =>
      layoutSlots({ dayStart: '09:00', slotMinutes: 15, candidates: [{ id: 'a' }, { id: 'a' }] }),
    ).toThrow(/twice/);
  });
  it('clock helpers', () => {
    expect(parseClock('09:30')).toBe(570);
    expect(formatClock(570)).toBe('09:30');
    expect(() => formatClock(1440)).toThrow();
    expect(intervalsOverlap({ start: 0, end: 15 }, { start: 15, end: 30 })).toBe(false);
  });
});
