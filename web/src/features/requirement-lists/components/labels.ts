// Words for the requirement-list vocabulary, and the per-line figures computed live with the
// shared functions (note counts, notes per second, durations).
import {
  displayNoteName,
  formatMetronomeMark,
  isCountedKind,
  itemDurationSeconds,
  keyLabel,
  noteCount,
  notesPerSecond,
  subdivisionName,
  type Articulation,
  type BeatUnit,
  type Direction,
  type Dynamic,
  type Motion,
  type NoteNameConvention,
  type Request,
  type RequestKind,
  type Tempo,
} from '@stavemark/shared';
import {
  DIRECTION_LABELS,
  HANDS_LABELS,
  INVERSION_LABELS,
  KIND_LABELS,
  octavesLabel,
} from '@/components/music-labels';

// The vocabulary shared with other pages lives in components/music-labels.ts.
export {
  DIRECTION_LABELS,
  HANDS_LABELS,
  INVERSION_LABELS,
  KIND_LABELS,
  keyWord,
  MODE_LABELS,
  octavesLabel,
} from '@/components/music-labels';

export const MOTION_LABELS: Record<Motion, string> = {
  similar: 'similar motion',
  contrary: 'contrary motion',
  third_apart: 'a third apart',
  sixth_apart: 'a sixth apart',
};
export const ARTICULATION_LABELS: Record<Articulation, string> = {
  legato: 'legato',
  staccato: 'staccato',
};
export const DYNAMIC_LABELS: Record<Dynamic, string> = {
  pp: 'pp',
  p: 'p',
  mp: 'mp',
  mf: 'mf',
  f: 'f',
  ff: 'ff',
  crescendo: 'crescendo',
  diminuendo: 'diminuendo',
};

/** "crotchet = 80, semiquavers" in the person's convention. */
export function tempoLabel(tempo: Tempo, convention: NoteNameConvention): string {
  try {
    const mark = formatMetronomeMark(tempo, convention);
    const notes = subdivisionName(tempo.beatUnit, tempo.notesPerBeat, convention);
    return notes ? `${mark}, ${notes}` : `${mark}, ${tempo.notesPerBeat} notes a beat`;
  } catch {
    return '—';
  }
}

export function formatSeconds(s: number): string {
  if (!Number.isFinite(s)) return '—';
  if (s < 60) return `${s.toFixed(1)} s`;
  const m = Math.floor(s / 60);
  return `${m} min ${Math.round(s - m * 60)} s`;
}

export interface SpanFigures {
  octaves: number;
  direction: Direction;
  notes: number | null;
  seconds: number;
}
export interface LineFigures {
  spans: SpanFigures[];
  notesPerSecond: number | null;
  /** Why nothing could be computed (an incomplete line), in words. */
  problem: string | null;
}

interface LineLike {
  kind: RequestKind;
  octaves?: readonly number[];
  directions?: readonly Direction[];
  tempo?: { bpm?: number; notesPerBeat?: number; beatUnit?: BeatUnit };
  durationSeconds?: number;
}

/** Note count, notes per second and playing time for each octave and direction a line allows. */
export function lineFigures(line: LineLike): LineFigures {
  const bpm = Number(line.tempo?.bpm);
  const npb = Number(line.tempo?.notesPerBeat);
  let nps: number | null = null;
  try {
    nps = notesPerSecond({ bpm, notesPerBeat: npb });
  } catch {
    return {
      spans: [],
      notesPerSecond: null,
      problem: 'Give the tempo (beats per minute and notes per beat) to see the timing.',
    };
  }
  if (!isCountedKind(line.kind)) {
    const d = Number(line.durationSeconds);
    if (!(d > 0))
      return { spans: [], notesPerSecond: nps, problem: 'Give the playing time in seconds.' };
    return {
      spans: [{ octaves: 0, direction: 'up', notes: null, seconds: d }],
      notesPerSecond: nps,
      problem: null,
    };
  }
  const octaves = [...(line.octaves ?? [])]
    .filter((o) => Number.isInteger(o))
    .sort((a, b) => a - b);
  if (octaves.length === 0)
    return { spans: [], notesPerSecond: nps, problem: 'Choose the octaves to see note counts.' };
  const directions: Direction[] =
    line.directions && line.directions.length > 0 ? [...line.directions] : ['up_down'];
  const spans: SpanFigures[] = [];
  for (const o of octaves)
    for (const direction of directions) {
      const tempo = { bpm, notesPerBeat: npb };
      spans.push({
        octaves: o,
        direction,
        notes: noteCount({ kind: line.kind, octaves: o, direction }),
        seconds: itemDurationSeconds({ kind: line.kind, octaves: o, direction, tempo }),
      });
    }
  return { spans, notesPerSecond: nps, problem: null };
}

/** One drawn request in words: "D harmonic minor, hands together, similar motion, 2 octaves, up and down, legato". */
export function describeRequest(r: Request): string {
  const parts: string[] = [];
  if (r.title) parts.push(r.title);
  else {
    const what = KIND_LABELS[r.kind];
    if (r.kind === 'chromatic' || r.kind === 'diminished_seventh')
      parts.push(`${what} starting on ${r.key ? displayNoteName(r.key) : '?'}`);
    else if (r.kind === 'dominant_seventh')
      parts.push(`${what} in ${r.key ? displayNoteName(r.key) : '?'}`);
    else parts.push(`${r.key ? keyLabel(r.key, r.mode) : '?'} ${what.toLowerCase()}`);
  }
  if (r.inversion && r.inversion !== 'root') parts.push(INVERSION_LABELS[r.inversion]);
  parts.push(HANDS_LABELS[r.hands]);
  if (r.motion) parts.push(MOTION_LABELS[r.motion]);
  if (r.title === null) parts.push(octavesLabel(r.octaves), DIRECTION_LABELS[r.direction]);
  if (r.articulation) parts.push(ARTICULATION_LABELS[r.articulation]);
  if (r.dynamic) parts.push(DYNAMIC_LABELS[r.dynamic]);
  return parts.join(', ');
}
