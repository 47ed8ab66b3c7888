// Note counts, tempo arithmetic and item durations (design.md §4.2).
import {
  isCountedKind,
  type CountedKind,
  type Direction,
  type RequestKind,
  type Tempo,
} from './domain.js';

/** The largest span we accept; piano scales in graded exams run to four octaves. */
export const MAX_OCTAVES = 8;

export interface NoteCountInput {
  kind: RequestKind;
  octaves: number;
  direction: Direction;
}

/**
 * Notes in a scale, arpeggio or broken chord, per hand (hands together and contrary motion give
 * the same count per hand). One way: scale 7·o+1, chromatic 12·o+1, triad arpeggio 3·o+1,
 * seventh arpeggios (dominant and diminished seventh) 4·o+1. Up and down: 2·(one way)−1, the top
 * note played once.
 *
 * Broken chords follow one stated pattern (our convention, not a universal rule): the triad is
 * broken in groups of three notes, one group per position (root, first inversion, second
 * inversion) in each octave, then the top root: C major, one octave, up = C-E-G E-G-C G-C-E C,
 * i.e. 9·o+1 one way.
 *
 * Passages and "other" items have no computed count: the function returns null for them, so a
 * caller must use the line's stated duration instead.
 */
export function noteCount(input: NoteCountInput & { kind: CountedKind }): number;
export function noteCount(input: NoteCountInput): number | null;
export function noteCount({ kind, octaves, direction }: NoteCountInput): number | null {
  assertOctaves(octaves);
  if (direction !== 'up' && direction !== 'up_down') {
    throw new RangeError(`Unknown direction "${String(direction)}": use "up" or "up_down".`);
  }
  if (!isCountedKind(kind)) return null;
  const oneWay = NOTES_PER_OCTAVE[kind] * octaves + 1;
  return direction === 'up' ? oneWay : 2 * oneWay - 1;
}

const NOTES_PER_OCTAVE: Record<CountedKind, number> = {
  scale: 7,
  chromatic: 12,
  arpeggio: 3,
  dominant_seventh: 4,
  diminished_seventh: 4,
  broken_chord: 9,
};

function assertOctaves(octaves: number): void {
  if (!Number.isInteger(octaves) || octaves < 1 || octaves > MAX_OCTAVES) {
    throw new RangeError(
      `Octaves must be a whole number from 1 to ${MAX_OCTAVES}, got ${String(octaves)}.`,
    );
  }
}

/** Notes per second = bpm × notes per beat / 60. */
export function notesPerSecond({ bpm, notesPerBeat }: Pick<Tempo, 'bpm' | 'notesPerBeat'>): number {
  if (!Number.isFinite(bpm) || bpm <= 0)
    throw new RangeError(`bpm must be a positive number, got ${String(bpm)}.`);
  if (!Number.isFinite(notesPerBeat) || notesPerBeat <= 0) {
    throw new RangeError(`notesPerBeat must be a positive number, got ${String(notesPerBeat)}.`);
  }
  return (bpm * notesPerBeat) / 60;
}

export interface DurationInput {
  kind: RequestKind;
  octaves: number;
  direction: Direction;
  tempo: Pick<Tempo, 'bpm' | 'notesPerBeat'>;
  /** Required for passages and "other": their stated playing time. */
  durationSeconds?: number | null;
}

/**
 * Playing time of one request in seconds: notes ÷ notes per second (the last note counted as one
 * note-length, no held ending). Passages and "other" use their stated duration; without one this
 * throws, because no honest estimate exists.
 */
export function itemDurationSeconds(request: DurationInput): number {
  const notes = noteCount(request);
  if (notes === null) {
    const d = request.durationSeconds;
    if (d === undefined || d === null || !Number.isFinite(d) || d <= 0) {
      throw new RangeError(
        `A ${request.kind} has no note count: give its durationSeconds (a positive number).`,
      );
    }
    return d;
  }
  return notes / notesPerSecond(request.tempo);
}

/**
 * Notes actually played, counting both hands when hands play together; the base of the slip rate
 * (slips per 100 notes played, design.md §4.3). Null for passages and "other".
 */
export function notesPlayed(
  request: Pick<NoteCountInput, 'kind' | 'octaves' | 'direction'> & { hands: 'RH' | 'LH' | 'HT' },
): number | null {
  const perHand = noteCount(request);
  if (perHand === null) return null;
  return request.hands === 'HT' ? 2 * perHand : perHand;
}
