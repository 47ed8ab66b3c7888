// Note-value names in the person's convention (design.md §9) and metronome marks.
import type { NoteNameConvention } from '../schemas/roles.js';
import { BEAT_UNITS, type BeatUnit } from './domain.js';

const NAMES: Record<BeatUnit, { british: string; american: string }> = {
  whole: { british: 'semibreve', american: 'whole' },
  half: { british: 'minim', american: 'half' },
  quarter: { british: 'crotchet', american: 'quarter' },
  eighth: { british: 'quaver', american: 'eighth' },
  sixteenth: { british: 'semiquaver', american: 'sixteenth' },
  dotted_half: { british: 'dotted minim', american: 'dotted half' },
  dotted_quarter: { british: 'dotted crotchet', american: 'dotted quarter' },
  dotted_eighth: { british: 'dotted quaver', american: 'dotted eighth' },
};

/** Smaller values than the beat units, for "notes per beat" wording (e.g. demisemiquavers). */
const SMALL_NAMES = {
  thirty_second: { british: 'demisemiquaver', american: 'thirty-second' },
} as const;

export type NoteValue = BeatUnit | keyof typeof SMALL_NAMES;

/** Name of a note value in British (crotchet, quaver) or American (quarter, eighth) use. */
export function noteValueName(value: NoteValue, convention: NoteNameConvention): string {
  const entry =
    (NAMES as Record<string, { british: string; american: string }>)[value] ??
    (SMALL_NAMES as Record<string, { british: string; american: string }>)[value];
  if (!entry) throw new RangeError(`Unknown note value "${String(value)}".`);
  if (convention !== 'british' && convention !== 'american') {
    throw new RangeError(
      `Unknown convention "${String(convention)}": use "british" or "american".`,
    );
  }
  return entry[convention];
}

/** Length of a beat unit as a fraction of a whole note (semibreve), e.g. dotted_quarter = 3/8. */
export function beatUnitFraction(unit: BeatUnit): number {
  const base: Record<string, number> = {
    whole: 1,
    half: 1 / 2,
    quarter: 1 / 4,
    eighth: 1 / 8,
    sixteenth: 1 / 16,
  };
  const dotted = unit.startsWith('dotted_');
  const b = base[dotted ? unit.slice('dotted_'.length) : unit];
  if (b === undefined) throw new RangeError(`Unknown beat unit "${String(unit)}".`);
  return dotted ? b * 1.5 : b;
}

export function isBeatUnit(value: string): value is BeatUnit {
  return (BEAT_UNITS as readonly string[]).includes(value);
}

/**
 * A metronome mark as words: "crotchet = 80" (British) or "quarter = 80" (American).
 * Words rather than note glyphs, so it reads the same in every font and to screen readers.
 */
export function formatMetronomeMark(
  tempo: { bpm: number; beatUnit: BeatUnit },
  convention: NoteNameConvention,
): string {
  if (!Number.isFinite(tempo.bpm) || tempo.bpm <= 0)
    throw new RangeError(`bpm must be a positive number, got ${String(tempo.bpm)}.`);
  const bpm = Number.isInteger(tempo.bpm)
    ? String(tempo.bpm)
    : String(Math.round(tempo.bpm * 10) / 10);
  return `${noteValueName(tempo.beatUnit, convention)} = ${bpm}`;
}

/**
 * Name of the note value played when `notesPerBeat` equal notes fill one beat, e.g. a crotchet
 * beat with 4 notes per beat = semiquavers. Null when the division is not a plain note value
 * (e.g. triplets), which the caller then describes in numbers.
 */
export function subdivisionName(
  beatUnit: BeatUnit,
  notesPerBeat: number,
  convention: NoteNameConvention,
  plural = true,
): string | null {
  const fraction = beatUnitFraction(beatUnit) / notesPerBeat;
  const byFraction: [number, NoteValue][] = [
    [1, 'whole'],
    [1 / 2, 'half'],
    [1 / 4, 'quarter'],
    [1 / 8, 'eighth'],
    [1 / 16, 'sixteenth'],
    [3 / 4, 'dotted_half'],
    [3 / 8, 'dotted_quarter'],
    [3 / 16, 'dotted_eighth'],
    [1 / 32, 'thirty_second'],
  ];
  const hit = byFraction.find(([f]) => Math.abs(f - fraction) < 1e-12);
  if (!hit) return null;
  const name = noteValueName(hit[1], convention);
  return plural ? `${name}s` : name;
}
