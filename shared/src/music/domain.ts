// Domain vocabulary of requirement lists, requests and rubrics (design.md §3).
// Plain constants and types so api, web and the computations share one spelling.

export const REQUEST_KINDS = [
  'scale',
  'arpeggio',
  'broken_chord',
  'chromatic',
  'dominant_seventh',
  'diminished_seventh',
  'passage',
  'other',
] as const;
export type RequestKind = (typeof REQUEST_KINDS)[number];

/** Kinds whose note count follows from the octaves (everything but passages and "other"). */
export const COUNTED_KINDS = [
  'scale',
  'arpeggio',
  'broken_chord',
  'chromatic',
  'dominant_seventh',
  'diminished_seventh',
] as const satisfies readonly RequestKind[];
export type CountedKind = (typeof COUNTED_KINDS)[number];

/** Kinds played in a key with a mode (major / minor forms). */
export const MODAL_KINDS = [
  'scale',
  'arpeggio',
  'broken_chord',
] as const satisfies readonly RequestKind[];

/** Kinds that may be asked in an inversion (starting on the 3rd, 5th or 7th). */
export const INVERTIBLE_KINDS = [
  'arpeggio',
  'broken_chord',
  'dominant_seventh',
  'diminished_seventh',
] as const satisfies readonly RequestKind[];

export const MODES = ['major', 'harmonic_minor', 'melodic_minor', 'natural_minor'] as const;
export type Mode = (typeof MODES)[number];

export const HANDS = ['RH', 'LH', 'HT'] as const;
export type Hands = (typeof HANDS)[number];
/** One hand, as used for fingerings and single-hand substitutions. */
export type Hand = Exclude<Hands, 'HT'>;

/** Motion applies only when hands play together. */
export const MOTIONS = ['similar', 'contrary', 'third_apart', 'sixth_apart'] as const;
export type Motion = (typeof MOTIONS)[number];

export const DIRECTIONS = ['up', 'up_down'] as const;
export type Direction = (typeof DIRECTIONS)[number];

export const ARTICULATIONS = ['legato', 'staccato'] as const;
export type Articulation = (typeof ARTICULATIONS)[number];

export const DYNAMICS = ['pp', 'p', 'mp', 'mf', 'f', 'ff', 'crescendo', 'diminuendo'] as const;
export type Dynamic = (typeof DYNAMICS)[number];

/** Root position and inversions; `third` exists only for seventh chords. */
export const INVERSIONS = ['root', 'first', 'second', 'third'] as const;
export type Inversion = (typeof INVERSIONS)[number];

/**
 * Beat units in a neutral form (American-style identifiers, no locale implied); shown to people
 * through `noteValueName` in their own convention.
 */
export const BEAT_UNITS = [
  'whole',
  'half',
  'quarter',
  'eighth',
  'sixteenth',
  'dotted_half',
  'dotted_quarter',
  'dotted_eighth',
] as const;
export type BeatUnit = (typeof BEAT_UNITS)[number];

export interface Tempo {
  /** Beats per minute of the beat unit. */
  bpm: number;
  beatUnit: BeatUnit;
  /** Notes played per beat (e.g. 4 semiquavers to a crotchet beat). */
  notesPerBeat: number;
}

/**
 * One line of a requirement list: a template of what may be asked, the way exam requirements
 * are written ("these keys, these modes, hands together, two octaves, legato").
 * Empty option arrays mean "not applicable" (e.g. modes for a chromatic scale).
 */
export interface RequirementLine {
  id: string;
  kind: RequestKind;
  /** Shown to people; optional. */
  label?: string;
  /** Key tonics (scales, arpeggios, broken chords, dominant sevenths: the key) or starting notes. */
  keys: string[];
  modes: Mode[];
  hands: Hands[];
  /** Used when hands play together; RH/LH requests carry no motion. */
  motions: Motion[];
  octaves: number[];
  /** Directions allowed; defaults to up and down when empty. */
  directions?: Direction[];
  articulations: Articulation[];
  dynamics: Dynamic[];
  inversions: Inversion[];
  tempo: Tempo;
  rubricVersionId: string;
  /** Relative weight of a request drawn from this line (> 0); also used to spread difficulty. */
  difficultyWeight: number;
  /** Passages and "other": the titles that may be asked. */
  titles?: string[];
  /** Passages and "other": expected playing time in seconds (no note count exists for them). */
  durationSeconds?: number;
}

export interface SelectionRule {
  /** How many requests the examiner asks. */
  count: number;
  /** Minimum number of requests per kind. */
  minPerKind: Partial<Record<RequestKind, number>>;
}

export interface RequirementListVersion {
  id: string;
  name?: string;
  grade?: string;
  version?: number;
  lines: RequirementLine[];
  selectionRule: SelectionRule;
  /** Marks the whole sheet is scaled to. */
  totalMarks: number;
}

/** A substitution actually applied to a drawn request (from the candidate's access arrangement). */
export interface AppliedSubstitution {
  /** Every substitution that changed this request, in the order applied. */
  types: Substitution['type'][];
  /** What the request was before the substitution, for the record. */
  original: { hands: Hands; motion: Motion | null; octaves: number; bpm: number };
}

/** One concrete thing asked, drawn from a line (e.g. D harmonic minor, HT, similar, 2 octaves). */
export interface Request {
  /** 0-based position in the draw after substitutions. */
  index: number;
  lineId: string;
  kind: RequestKind;
  /** Key tonic or starting note; null for passages and "other". */
  key: string | null;
  mode: Mode | null;
  hands: Hands;
  motion: Motion | null;
  octaves: number;
  direction: Direction;
  articulation: Articulation | null;
  dynamic: Dynamic | null;
  inversion: Inversion | null;
  tempo: Tempo;
  rubricVersionId: string;
  difficultyWeight: number;
  /** Passages and "other". */
  title: string | null;
  durationSeconds: number | null;
  substitution: AppliedSubstitution | null;
}

/**
 * Approved substitutions from an access arrangement (design.md §3). `appliesTo` limits a
 * substitution to some kinds; without it, it applies to every kind it can.
 */
export type Substitution =
  /** A hands-together request becomes two requests: right hand, then left hand. */
  | { type: 'hands_separately'; appliesTo?: RequestKind[] }
  /** A hands-together request is played by one named hand. */
  | { type: 'single_hand'; hand: Hand; appliesTo?: RequestKind[] }
  /** No request spans more octaves than this. */
  | { type: 'max_octaves'; octaves: number; appliesTo?: RequestKind[] }
  /** Tempo lowered to this percentage of the set bpm (e.g. 80). */
  | { type: 'tempo_percent'; percent: number; appliesTo?: RequestKind[] };

export interface LevelDescriptor {
  /** Lowest mark the descriptor covers (inclusive). */
  min: number;
  /** Highest mark the descriptor covers (inclusive). */
  max: number;
  text: string;
}

export interface RubricCriterion {
  key: string;
  label: string;
  description?: string;
  /** Relative weight in the request's score (> 0). */
  weight: number;
  /** Maximum mark, an integer 1..10; marks are integers 0..maxMark. */
  maxMark: number;
  descriptors: LevelDescriptor[];
}

export interface RubricVersion {
  id: string;
  name: string;
  version?: number;
  kinds: RequestKind[];
  criteria: RubricCriterion[];
}

export const SLOT_OUTCOMES = ['completed', 'absent', 'withdrawn', 'incomplete'] as const;
export type SlotOutcome = (typeof SLOT_OUTCOMES)[number];

export function isCountedKind(kind: RequestKind): kind is CountedKind {
  return (COUNTED_KINDS as readonly string[]).includes(kind);
}
export function isModalKind(kind: RequestKind): boolean {
  return (MODAL_KINDS as readonly string[]).includes(kind);
}
export function isInvertibleKind(kind: RequestKind): boolean {
  return (INVERTIBLE_KINDS as readonly string[]).includes(kind);
}
