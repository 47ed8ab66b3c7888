import { describe, expect, it } from 'vitest';
import { itemDurationSeconds, noteCount, notesPerSecond, notesPlayed } from './notes.js';

describe('noteCount (design.md §4.2 formulas; counts are common practice)', () => {
  it('one-octave C major scale has 8 notes up (C D E F G A B C, common practice) and 15 up and down', () => {
    expect(noteCount({ kind: 'scale', octaves: 1, direction: 'up' })).toBe(8);
    expect(noteCount({ kind: 'scale', octaves: 1, direction: 'up_down' })).toBe(15);
  });
  it('two-octave scale: 15 up, 29 up and down (common practice: top note played once)', () => {
    expect(noteCount({ kind: 'scale', octaves: 2, direction: 'up' })).toBe(15);
    expect(noteCount({ kind: 'scale', octaves: 2, direction: 'up_down' })).toBe(29);
  });
  it('chromatic scale over one octave has 13 notes up (12 semitones plus the octave, common practice)', () => {
    expect(noteCount({ kind: 'chromatic', octaves: 1, direction: 'up' })).toBe(13);
    expect(noteCount({ kind: 'chromatic', octaves: 2, direction: 'up_down' })).toBe(49);
  });
  it('triad arpeggio C-E-G-C is 4 notes for one octave, 3·o+1 (common practice)', () => {
    expect(noteCount({ kind: 'arpeggio', octaves: 1, direction: 'up' })).toBe(4);
    expect(noteCount({ kind: 'arpeggio', octaves: 2, direction: 'up' })).toBe(7);
    expect(noteCount({ kind: 'arpeggio', octaves: 2, direction: 'up_down' })).toBe(13);
  });
  it('seventh arpeggios G-B-D-F-G are 4·o+1 (common practice)', () => {
    expect(noteCount({ kind: 'dominant_seventh', octaves: 1, direction: 'up' })).toBe(5);
    expect(noteCount({ kind: 'diminished_seventh', octaves: 3, direction: 'up_down' })).toBe(25);
  });
  it('broken chord in our stated pattern: C-E-G E-G-C G-C-E C = 10 notes for one octave (our convention)', () => {
    expect(noteCount({ kind: 'broken_chord', octaves: 1, direction: 'up' })).toBe(10);
    expect(noteCount({ kind: 'broken_chord', octaves: 2, direction: 'up_down' })).toBe(37);
  });
  it('up and down is always 2·(one way)−1', () => {
    for (const kind of [
      'scale',
      'chromatic',
      'arpeggio',
      'broken_chord',
      'dominant_seventh',
    ] as const) {
      for (let o = 1; o <= 4; o++) {
        const up = noteCount({ kind, octaves: o, direction: 'up' });
        expect(noteCount({ kind, octaves: o, direction: 'up_down' })).toBe(2 * up - 1);
      }
    }
  });
  it('passages and "other" have no computed count (null)', () => {
    expect(noteCount({ kind: 'passage', octaves: 1, direction: 'up' })).toBeNull();
    expect(noteCount({ kind: 'other', octaves: 1, direction: 'up_down' })).toBeNull();
  });
  it('rejects octaves that are not whole numbers from 1 to 8', () => {
    expect(() => noteCount({ kind: 'scale', octaves: 0, direction: 'up' })).toThrow(/Octaves/);
    expect(() => noteCount({ kind: 'scale', octaves: 1.5, direction: 'up' })).toThrow(/Octaves/);
    expect(() => noteCount({ kind: 'scale', octaves: 9, direction: 'up' })).toThrow(/Octaves/);
  });
  it('rejects an unknown direction', () => {
    expect(() => noteCount({ kind: 'scale', octaves: 1, direction: 'down' as never })).toThrow(
      /direction/,
    );
  });
});

describe('tempo arithmetic (hand-worked examples)', () => {
  it('crotchet = 60 with 2 notes per beat is 2 notes per second (60·2/60)', () => {
    expect(notesPerSecond({ bpm: 60, notesPerBeat: 2 })).toBe(2);
  });
  it('crotchet = 80 in semiquavers is 80·4/60 = 5⅓ notes per second', () => {
    expect(notesPerSecond({ bpm: 80, notesPerBeat: 4 })).toBeCloseTo(16 / 3, 12);
  });
  it('a two-octave scale up and down (29 notes) at 80 × 4 lasts 29 ÷ 5⅓ = 5.4375 s (hand-worked)', () => {
    const s = itemDurationSeconds({
      kind: 'scale',
      octaves: 2,
      direction: 'up_down',
      tempo: { bpm: 80, notesPerBeat: 4 },
    });
    expect(s).toBeCloseTo(5.4375, 10);
  });
  it('a one-octave scale up and down (15 notes) at 60 × 2 lasts 7.5 s (hand-worked)', () => {
    expect(
      itemDurationSeconds({
        kind: 'scale',
        octaves: 1,
        direction: 'up_down',
        tempo: { bpm: 60, notesPerBeat: 2 },
      }),
    ).toBe(7.5);
  });
  it('a passage uses its stated duration and refuses to guess without one', () => {
    expect(
      itemDurationSeconds({
        kind: 'passage',
        octaves: 1,
        direction: 'up',
        tempo: { bpm: 60, notesPerBeat: 1 },
        durationSeconds: 45,
      }),
    ).toBe(45);
    expect(() =>
      itemDurationSeconds({
        kind: 'passage',
        octaves: 1,
        direction: 'up',
        tempo: { bpm: 60, notesPerBeat: 1 },
      }),
    ).toThrow(/durationSeconds/);
  });
  it('rejects a tempo of zero or less', () => {
    expect(() => notesPerSecond({ bpm: 0, notesPerBeat: 4 })).toThrow(/bpm/);
    expect(() => notesPerSecond({ bpm: 60, notesPerBeat: -1 })).toThrow(/notesPerBeat/);
  });
  it('notes played count both hands when hands play together', () => {
    expect(notesPlayed({ kind: 'scale', octaves: 2, direction: 'up_down', hands: 'HT' })).toBe(58);
    expect(notesPlayed({ kind: 'scale', octaves: 2, direction: 'up_down', hands: 'LH' })).toBe(29);
    expect(notesPlayed({ kind: 'passage', octaves: 1, direction: 'up', hands: 'HT' })).toBeNull();
  });
});
