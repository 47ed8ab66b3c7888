import { keyLabel, type Request } from '@stavemark/shared';

const KIND: Record<Request['kind'], string> = {
  scale: 'scale',
  arpeggio: 'arpeggio',
  broken_chord: 'broken chord',
  chromatic: 'chromatic scale',
  dominant_seventh: 'dominant seventh',
  diminished_seventh: 'diminished seventh',
  passage: 'Passage',
  other: 'Piece',
};
const HANDS: Record<Request['hands'], string> = {
  RH: 'right hand',
  LH: 'left hand',
  HT: 'hands together',
};

/** "D harmonic minor scale, hands together" / "Passage: Morning Rain", for results and reports. */
export function requestLabel(r: Request): string {
  const what =
    r.key === null
      ? `${KIND[r.kind]}${r.title ? `: ${r.title}` : ''}`
      : `${keyLabel(r.key, r.mode)} ${KIND[r.kind]}`;
  return `${what}, ${HANDS[r.hands]}`;
}
