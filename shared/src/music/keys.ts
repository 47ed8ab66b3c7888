// Key names and spellings from @tonaljs/tonal (a general-purpose music-theory library), not from
// tables of our own (issue 3 §3).
import { Chord, Key, Note, Scale } from '@tonaljs/tonal';
import type { Inversion, Mode, RequestKind } from './domain.js';

/** Tonal's scale names for our modes. Natural minor is tonal's "minor" (aeolian). */
const TONAL_SCALE: Record<Mode, string> = {
  major: 'major',
  harmonic_minor: 'harmonic minor',
  melodic_minor: 'melodic minor',
  natural_minor: 'minor',
};

/**
 * Normalises a key or starting-note name ("eb" → "Eb", "F#" → "F#"). Accepts a letter A–G with
 * at most one sharp or flat and no octave; throws otherwise, naming the input.
 */
export function normaliseKeyName(name: string): string {
  const note = Note.get(name.trim());
  if (note.empty || note.oct !== undefined || Math.abs(note.alt) > 1) {
    throw new RangeError(
      `"${name}" is not a key or note name: use a letter A–G with an optional # or b (e.g. "F#", "Bb").`,
    );
  }
  return note.pc;
}

export function isKeyName(name: string): boolean {
  try {
    normaliseKeyName(name);
    return true;
  } catch {
    return false;
  }
}

/**
 * Keys with a conventional key signature (up to seven sharps or flats), in circle-of-fifths order
 * from seven flats to seven sharps: 15 major keys (Cb … C#), 15 minor keys (Ab … A#).
 */
export function allowedKeys(mode: Mode): string[] {
  const start = mode === 'major' ? 'C' : 'A';
  return Array.from({ length: 15 }, (_, i) => Note.transposeFifths(start, i - 7));
}

/** Sharps (positive) or flats (negative) in the key signature; the minor forms share one. */
export function keySignatureAccidentals(tonic: string, mode: Mode): number {
  const pc = normaliseKeyName(tonic);
  const key = mode === 'major' ? Key.majorKey(pc) : Key.minorKey(pc);
  return key.alteration;
}

export interface ScaleSpelling {
  ascending: string[];
  /** Descending from the top tonic; the melodic minor descends as the natural minor (classical use). */
  descending: string[];
}

/** One octave of a scale's pitch-class spelling, e.g. D harmonic minor: D E F G A Bb C#. */
export function scaleNotes(tonic: string, mode: Mode): string[] {
  const pc = normaliseKeyName(tonic);
  const notes = Scale.get(`${pc} ${TONAL_SCALE[mode]}`).notes;
  if (notes.length !== 7) throw new RangeError(`No ${mode.replace('_', ' ')} scale on "${tonic}".`);
  return notes;
}

/**
 * Ascending and descending spelling as pianists learn it: tonal's melodic minor is the ascending
 * ("jazz") form, so the descent uses the natural minor, as classical teaching does.
 */
export function scaleSpelling(tonic: string, mode: Mode): ScaleSpelling {
  const up = scaleNotes(tonic, mode);
  const downSource = mode === 'melodic_minor' ? scaleNotes(tonic, 'natural_minor') : up;
  const first = up[0] as string;
  const descending = [first, ...[...downSource.slice(1)].reverse(), first];
  return { ascending: [...up, first], descending };
}

/** Tonic triad of the key (every minor form has the same triad). */
export function triadNotes(tonic: string, mode: Mode): string[] {
  const pc = normaliseKeyName(tonic);
  return Chord.getChord(mode === 'major' ? 'M' : 'm', pc).notes;
}

/** Dominant seventh *in* a key: the V7 built on the key's fifth degree (minor keys: harmonic V7). */
export function dominantSeventhNotes(keyTonic: string): string[] {
  const pc = normaliseKeyName(keyTonic);
  return Chord.getChord('7', Note.transpose(pc, '5P')).notes;
}

/** Diminished seventh starting on a note, spelled in stacked minor thirds (e.g. B D F Ab). */
export function diminishedSeventhNotes(start: string): string[] {
  return Chord.getChord('dim7', normaliseKeyName(start)).notes;
}

/** The twelve notes of a chromatic scale from a starting note, as tonal spells them. */
export function chromaticNotes(start: string): string[] {
  return Scale.get(`${normaliseKeyName(start)} chromatic`).notes;
}

const INVERSION_STEP: Record<Inversion, number> = { root: 0, first: 1, second: 2, third: 3 };

/**
 * The pitch classes a request is built from, in playing order for one octave, so the desk can
 * show them: a scale's degrees, a chord's notes rotated for the inversion. Null for passages,
 * "other", and requests without a key.
 */
export function requestPitchClasses(request: {
  kind: RequestKind;
  key: string | null;
  mode: Mode | null;
  inversion: Inversion | null;
}): string[] | null {
  const { kind, key } = request;
  if (key === null) return null;
  const mode = request.mode ?? 'major';
  let notes: string[];
  switch (kind) {
    case 'scale':
      return scaleNotes(key, mode);
    case 'chromatic':
      return chromaticNotes(key);
    case 'arpeggio':
    case 'broken_chord':
      notes = triadNotes(key, mode);
      break;
    case 'dominant_seventh':
      notes = dominantSeventhNotes(key);
      break;
    case 'diminished_seventh':
      notes = diminishedSeventhNotes(key);
      break;
    default:
      return null;
  }
  const step = INVERSION_STEP[request.inversion ?? 'root'];
  if (step >= notes.length)
    throw new RangeError(`A ${kind} has no ${request.inversion} inversion.`);
  return [...notes.slice(step), ...notes.slice(0, step)];
}

const MODE_LABEL: Record<Mode, string> = {
  major: 'major',
  harmonic_minor: 'harmonic minor',
  melodic_minor: 'melodic minor',
  natural_minor: 'natural minor',
};

/** A note name with music accidentals for display: "F#" → "F♯", "Bb" → "B♭". */
export function displayNoteName(name: string): string {
  const pc = normaliseKeyName(name);
  return pc.replace('#', '♯').replace(/(?<=^[A-G])b/, '♭');
}

/** "D harmonic minor", "F♯ major"; the mode may be absent (chromatic, sevenths). */
export function keyLabel(
  key: string,
  mode: Mode | null,
  options: { unicode?: boolean } = {},
): string {
  const name = options.unicode === false ? normaliseKeyName(key) : displayNoteName(key);
  return mode ? `${name} ${MODE_LABEL[mode]}` : name;
}

export function modeLabel(mode: Mode): string {
  return MODE_LABEL[mode];
}
