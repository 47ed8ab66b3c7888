import { DurationValue } from '@tonaljs/tonal';
import { describe, expect, it } from 'vitest';
import { BEAT_UNITS } from './domain.js';
import {
  beatUnitFraction,
  formatMetronomeMark,
  noteValueName,
  subdivisionName,
} from './noteValues.js';

describe('noteValueName', () => {
  it('plain values agree with @tonaljs/tonal DurationValue names (American, British)', () => {
    for (const unit of ['whole', 'half', 'quarter', 'eighth', 'sixteenth'] as const) {
      const tonal = DurationValue.get(unit);
      expect(tonal.names).toEqual([
        noteValueName(unit, 'american'),
        noteValueName(unit, 'british'),
      ]);
    }
    expect(DurationValue.get('thirty-second').names).toContain(
      noteValueName('thirty_second', 'british'),
    );
  });
  it('British names (common practice): semibreve, minim, crotchet, quaver, semiquaver, demisemiquaver', () => {
    expect(
      ['whole', 'half', 'quarter', 'eighth', 'sixteenth', 'thirty_second'].map((v) =>
        noteValueName(v as never, 'british'),
      ),
    ).toEqual(['semibreve', 'minim', 'crotchet', 'quaver', 'semiquaver', 'demisemiquaver']);
  });
  it('dotted values (common practice): dotted crotchet / dotted quarter', () => {
    expect(noteValueName('dotted_quarter', 'british')).toBe('dotted crotchet');
    expect(noteValueName('dotted_quarter', 'american')).toBe('dotted quarter');
  });
  it('dotted fractions agree with tonal (q. = 3/8 of a whole note)', () => {
    expect(beatUnitFraction('dotted_quarter')).toBe(DurationValue.get('q.').value);
    expect(beatUnitFraction('dotted_half')).toBe(DurationValue.get('h.').value);
    expect(beatUnitFraction('dotted_eighth')).toBe(DurationValue.get('e.').value);
    for (const u of ['whole', 'half', 'quarter', 'eighth', 'sixteenth'] as const)
      expect(beatUnitFraction(u)).toBe(DurationValue.get(u).value);
  });
  it('every beat unit has both names', () => {
    for (const u of BEAT_UNITS) {
      expect(noteValueName(u, 'british')).not.toBe('');
      expect(noteValueName(u, 'american')).not.toBe('');
    }
  });
  it('rejects unknown values and conventions', () => {
    expect(() => noteValueName('breve' as never, 'british')).toThrow(/Unknown note value/);
    expect(() => noteValueName('quarter', 'french' as never)).toThrow(/convention/);
  });
});

describe('formatMetronomeMark', () => {
  it('"crotchet = 80" and "quarter = 80" (common practice wording)', () => {
    expect(formatMetronomeMark({ bpm: 80, beatUnit: 'quarter' }, 'british')).toBe('crotchet = 80');
    expect(formatMetronomeMark({ bpm: 80, beatUnit: 'quarter' }, 'american')).toBe('quarter = 80');
    expect(formatMetronomeMark({ bpm: 60, beatUnit: 'dotted_quarter' }, 'british')).toBe(
      'dotted crotchet = 60',
    );
  });
  it('refuses a non-positive bpm', () => {
    expect(() => formatMetronomeMark({ bpm: 0, beatUnit: 'quarter' }, 'british')).toThrow(/bpm/);
  });
});

describe('subdivisionName', () => {
  it('four notes to a crotchet are semiquavers; three to a dotted crotchet are quavers (common practice)', () => {
    expect(subdivisionName('quarter', 4, 'british')).toBe('semiquavers');
    expect(subdivisionName('quarter', 2, 'american')).toBe('eighths');
    expect(subdivisionName('dotted_quarter', 3, 'british')).toBe('quavers');
  });
  it('triplets have no plain name', () => {
    expect(subdivisionName('quarter', 3, 'british')).toBeNull();
  });
});
