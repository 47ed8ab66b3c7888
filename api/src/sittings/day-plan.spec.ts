import { describe, expect, it } from 'vitest';
import { layoutSlots, type RequirementLine, type RequirementListVersion } from '@stavemark/shared';
import { candidateMinutes, paperMinutes, planDay } from './day-plan.js';

const mk = (l: Partial<RequirementLine> & Pick<RequirementLine, 'id' | 'kind'>): RequirementLine => ({
  keys: [],
  modes: [],
  hands: ['HT'],
  motions: [],
  octaves: [1],
  articulations: [],
  dynamics: [],
  inversions: [],
  tempo: { bpm: 60, beatUnit: 'quarter', notesPerBeat: 2 },
  rubricVersionId: 'rv',
  difficultyWeight: 1,
  ...l,
});
// The hand-worked list of shared/src/planning/slots.test.ts: a full selection at the slowest draw
// is 209 s of candidate time (89 s playing, 3 × 20 s asking, 60 s greeting).
const list: Pick<RequirementListVersion, 'lines' | 'selectionRule'> = {
  selectionRule: { count: 3, minPerKind: { scale: 1 } },
  lines: [
    mk({ id: 'sc', kind: 'scale', keys: ['C', 'G'], modes: ['major'], octaves: [1, 2] }),
    mk({ id: 'ar', kind: 'arpeggio', keys: ['C'], modes: ['major'], hands: ['RH', 'LH'], octaves: [2] }),
    mk({ id: 'pa', kind: 'passage', titles: ['Study'], durationSeconds: 60 }),
  ],
};

describe('slot arithmetic with extra time and rest breaks (hand-worked)', () => {
  it('the paper suggestion is planSlotMinutes with the write-up gap: 209 s + 120 s = 5.48 → 6 min', () => {
    expect(paperMinutes(list, 2, null)).toBe(6);
    expect(paperMinutes(list, 2, 10)).toBe(10);
  });

  it('suggested length, 25 % extra time and 5 min rest: 209 × 1.25 + 120 = 381.25 s → 7, + 5 = 12', () => {
    expect(candidateMinutes({ list, writeUpGapMinutes: 2, fixedMinutes: null, extraTimePercent: 25, restBreakMinutes: 5, substitutions: [] })).toBe(12);
  });

  it('hands separately asks more: 398 s → 7 min (shared planSlot), no extra time', () => {
    expect(
      candidateMinutes({
        list,
        writeUpGapMinutes: 2,
        fixedMinutes: null,
        extraTimePercent: 0,
        restBreakMinutes: 0,
        substitutions: [{ type: 'hands_separately', appliesTo: ['scale'] }],
      }),
    ).toBe(7);
  });

  it('a fixed 12-minute slot with a 3-minute write-up gap and 25 % extra: 9 × 1.25 = 11.25 → 12, + 3 = 15', () => {
    expect(candidateMinutes({ list, writeUpGapMinutes: 3, fixedMinutes: 12, extraTimePercent: 25, restBreakMinutes: 0, substitutions: [] })).toBe(15);
    // 12 × 1.25 = 15 exactly, not 16 (floating-point tolerance): fixed 15, gap 3, 25 % → 15 + 3 = 18
    expect(candidateMinutes({ list, writeUpGapMinutes: 3, fixedMinutes: 15, extraTimePercent: 25, restBreakMinutes: 0, substitutions: [] })).toBe(18);
    // with rest breaks of 4 minutes on top
    expect(candidateMinutes({ list, writeUpGapMinutes: 3, fixedMinutes: 12, extraTimePercent: 25, restBreakMinutes: 4, substitutions: [] })).toBe(19);
  });
});

describe('planDay', () => {
  const base = { dayStart: 9 * 60, dayEnd: 12 * 60, changeoverMinutes: 0, breaks: [{ start: 10 * 60 + 30, end: 10 * 60 + 45, label: 'Coffee' }] };

  it('agrees with the shared layoutSlots when no start times are chosen', () => {
    const lengths = [12, 12, 15, 12, 19, 12, 12, 12, 12, 12, 12, 12];
    for (const changeoverMinutes of [0, 2]) {
      const slots = lengths.map((minutes, i) => ({ id: `s${i}`, name: `C${i}`, minutes }));
      const mine = planDay({ ...base, changeoverMinutes, slots });
      const shared = layoutSlots({
        dayStart: base.dayStart,
        dayEnd: base.dayEnd,
        slotMinutes: 12,
        changeoverMinutes,
        breaks: base.breaks,
        candidates: slots.map((s) => ({ id: s.id, slotMinutes: s.minutes })),
      });
      const fits = mine.placed.filter((p) => !mine.problems.some((q) => q.slotId === p.id));
      expect(fits.map(({ id, start, end }) => ({ id, start, end }))).toEqual(shared.slots.map(({ id, start, end }) => ({ id, start, end })));
      expect(mine.problems.map((p) => p.slotId)).toEqual(shared.unplaced);
    }
  });

  it('a slot that would run into the break waits for its end (hand-worked)', () => {
    // 09:00–09:40, 09:40–10:20, then 40 min would end 11:00, across 10:30–10:45 → 10:45–11:25
    const r = planDay({ ...base, slots: [40, 40, 40].map((minutes, i) => ({ id: `s${i}`, name: `C${i}`, minutes })) });
    expect(r.placed.map((p) => [p.start, p.end])).toEqual([
      [540, 580],
      [580, 620],
      [645, 685],
    ]);
    expect(r.problems).toEqual([]);
  });

  it('refuses a chosen start inside a break, and names the break', () => {
    const r = planDay({ ...base, slots: [{ id: 'a', name: 'Ada Pendry', minutes: 12, notBefore: 10 * 60 + 35 }] });
    expect(r.problems).toEqual([
      { slotId: 'a', kind: 'inside_break', message: "Ada Pendry's slot at 10:35–10:47 would fall in the break 10:30–10:45 (Coffee): choose another start time." },
    ]);
  });

  it('refuses a chosen start whose slot runs into a break', () => {
    const r = planDay({ ...base, slots: [{ id: 'a', name: 'Ada', minutes: 12, notBefore: 10 * 60 + 25 }] });
    expect(r.problems.map((p) => p.kind)).toEqual(['inside_break']);
  });

  it('a chosen start already passed by the slot before is not a break problem: the slot follows on', () => {
    const r = planDay({ ...base, slots: [{ id: 'a', name: 'A', minutes: 100 }, { id: 'b', name: 'B', minutes: 10, notBefore: 10 * 60 + 35 }] });
    // a: 09:00–10:40 runs into the break? It starts at 09:00 (day start) and 09:00–10:40 overlaps
    // 10:30–10:45, so it waits: 10:45–12:25, past the end; b then follows.
    expect(r.placed[0]).toEqual({ id: 'a', start: 645, end: 745 });
    expect(r.problems.map((p) => [p.slotId, p.kind])).toEqual([
      ['a', 'past_day_end'],
      ['b', 'past_day_end'],
    ]);
  });

  it('reports every slot past the end of the day with its times', () => {
    const slots = Array.from({ length: 16 }, (_, i) => ({ id: `s${i}`, name: `C${i}`, minutes: 12 }));
    const r = planDay({ ...base, slots });
    // 7 slots 09:00–10:24; the 8th (10:24–10:36) would cross the break, so waits until 10:45;
    // six more to 11:57; the 14th would run 11:57–12:09
    expect(r.problems.map((p) => p.slotId)).toEqual(['s13', 's14', 's15']);
    expect(r.problems[0]!.message).toBe("C13's slot would run 11:57–12:09, past the end of the day at 12:00.");
  });

  it('a chosen start before the day starts is refused', () => {
    const r = planDay({ ...base, slots: [{ id: 'a', name: 'A', minutes: 10, notBefore: 8 * 60 }] });
    expect(r.problems.map((p) => p.kind)).toEqual(['before_day_start']);
  });
});
