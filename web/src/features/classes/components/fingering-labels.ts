// Words for a student's fingering: which request it is for, its span, and the key names a teacher may choose from (spelt by the shared music library).
import {
  allowedKeys,
  displayNoteName,
  isInvertibleKind,
  keyLabel,
  type Direction,
  type Inversion,
  type Mode,
  type RequestKind,
} from '@stavemark/shared';
import {
  DIRECTION_LABELS,
  INVERSION_LABELS,
  KIND_LABELS,
  octavesLabel,
} from '@/components/music-labels';

const LETTERS = 'CDEFGAB';

/**
 * Every key or starting note with a conventional signature (the shared `allowedKeys`, major and
 * minor together), in keyboard order: C♭, C, C♯, D♭, D …
 */
export function keyOptions(): { label: string; value: string }[] {
  const names = [...new Set([...allowedKeys('major'), ...allowedKeys('natural_minor')])];
  const rank = (n: string) =>
    LETTERS.indexOf(n[0]!) * 3 + (n.endsWith('b') ? 0 : n.endsWith('#') ? 2 : 1);
  return names
    .sort((a, b) => rank(a) - rank(b))
    .map((value) => ({ label: displayNoteName(value), value }));
}

/** Inversions a kind can be asked in: seventh chords have a third one. */
export function inversionsFor(kind: RequestKind): Inversion[] {
  if (!isInvertibleKind(kind)) return [];
  return kind === 'dominant_seventh' || kind === 'diminished_seventh'
    ? ['root', 'first', 'second', 'third']
    : ['root', 'first', 'second'];
}

/** "D harmonic minor scale", "Chromatic scale starting on F♯", "Dominant seventh in A♭, first inversion". */
export function fingeringTitle(f: {
  kind: RequestKind;
  key: string;
  mode: Mode | null;
  inversion: Inversion | null;
}): string {
  const what = KIND_LABELS[f.kind];
  let title: string;
  if (f.kind === 'chromatic' || f.kind === 'diminished_seventh')
    title = `${what} starting on ${displayNoteName(f.key)}`;
  else if (f.kind === 'dominant_seventh') title = `${what} in ${displayNoteName(f.key)}`;
  else title = `${keyLabel(f.key, f.mode)} ${what.toLowerCase()}`;
  return f.inversion ? `${title}, ${INVERSION_LABELS[f.inversion]}` : title;
}

/** "2 octaves, up and down". */
export function spanLabel(f: { octaves: number; direction: Direction }): string {
  return `${octavesLabel(f.octaves)}, ${DIRECTION_LABELS[f.direction]}`;
}
