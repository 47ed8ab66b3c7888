import {
  formatMetronomeMark,
  keyLabel,
  type NoteNameConvention,
  type Request,
} from '@stavemark/shared';

const KIND: Record<Request['kind'], string> = {
  scale: 'Scale',
  arpeggio: 'Arpeggio',
  broken_chord: 'Broken chord',
  chromatic: 'Chromatic scale',
  dominant_seventh: 'Dominant seventh',
  diminished_seventh: 'Diminished seventh',
  passage: 'Passage',
  other: 'Piece',
};
const HANDS: Record<Request['hands'], string> = {
  RH: 'right hand',
  LH: 'left hand',
  HT: 'hands together',
};
const MOTION: Record<NonNullable<Request['motion']>, string> = {
  similar: 'similar motion',
  contrary: 'contrary motion',
  third_apart: 'a third apart',
  sixth_apart: 'a sixth apart',
};

/** "D harmonic minor scale" / "Passage: Morning Rain". */
export function requestTitle(r: Request): string {
  if (r.key === null) return `${KIND[r.kind]}${r.title ? `: ${r.title}` : ''}`;
  const kind = KIND[r.kind].toLowerCase();
  return `${keyLabel(r.key, r.mode)} ${kind}`;
}

/** Hands, motion, octaves, articulation: the details asked, in words. */
export function requestDetails(r: Request): string[] {
  const out: string[] = [HANDS[r.hands]];
  if (r.motion) out.push(MOTION[r.motion]);
  if (r.key !== null) out.push(`${r.octaves} octave${r.octaves === 1 ? '' : 's'}`);
  if (r.inversion && r.inversion !== 'root') out.push(`${r.inversion} inversion`);
  if (r.articulation) out.push(r.articulation);
  if (r.dynamic) out.push(r.dynamic);
  return out;
}

export function tempoText(r: Request, convention: NoteNameConvention): string {
  return formatMetronomeMark(r.tempo, convention);
}
