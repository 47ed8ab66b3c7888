// Words for the musical vocabulary (kinds, modes, hands, inversions, directions), shared by the
// requirement lists, the students' fingerings and any page that names a request.
import type { Direction, Hands, Inversion, Mode, RequestKind } from '@stavemark/shared';

export const KIND_LABELS: Record<RequestKind, string> = {
  scale: 'Scale',
  arpeggio: 'Arpeggio',
  broken_chord: 'Broken chord',
  chromatic: 'Chromatic scale',
  dominant_seventh: 'Dominant seventh',
  diminished_seventh: 'Diminished seventh',
  passage: 'Passage',
  other: 'Other',
};
export const MODE_LABELS: Record<Mode, string> = {
  major: 'major',
  harmonic_minor: 'harmonic minor',
  melodic_minor: 'melodic minor',
  natural_minor: 'natural minor',
};
export const HANDS_LABELS: Record<Hands, string> = {
  RH: 'right hand',
  LH: 'left hand',
  HT: 'hands together',
};
export const DIRECTION_LABELS: Record<Direction, string> = {
  up: 'up only',
  up_down: 'up and down',
};
export const INVERSION_LABELS: Record<Inversion, string> = {
  root: 'root position',
  first: 'first inversion',
  second: 'second inversion',
  third: 'third inversion',
};

export function octavesLabel(n: number): string {
  return `${n} ${n === 1 ? 'octave' : 'octaves'}`;
}

/** "starting on" for kinds played from a note rather than in a key. */
export function keyWord(kind: RequestKind): string {
  return kind === 'chromatic' || kind === 'diminished_seventh' ? 'starting notes' : 'keys';
}
