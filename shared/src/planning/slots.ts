// Slot lengths and the layout of a sitting's day (design.md §4.2, issue 5 §1–§3).
import type {
  RequirementLine,
  RequirementListVersion,
  SelectionRule,
  Substitution,
} from '../music/domain.js';
import { isCountedKind, REQUEST_KINDS } from '../music/domain.js';
import { itemDurationSeconds } from '../music/notes.js';
import { lineRequestCount } from '../draw/draw.js';

export interface SlotPlanOptions {
  /** Examiner asks, candidate thinks and places hands: seconds per request. Default 20. */
  perRequestOverheadSeconds?: number;
  /** Greeting, settling, adjusting the stool: seconds per slot. Default 60. */
  greetingSeconds?: number;
  /** The examiner's write-up gap after the candidate leaves, in minutes. Default 0. */
  writeUpGapMinutes?: number;
  /** Extra time from an access arrangement, in percent of the candidate's time. Default 0. */
  extraTimePercent?: number;
  /** Approved substitutions: hands separately doubles a hands-together request, tempo_percent slows it. */
  substitutions?: readonly Substitution[];
  /** Defaults to the list's own selection rule. */
  rule?: SelectionRule;
}

export interface SlotPlan {
  /** Suggested slot length, rounded up to a whole minute. */
  minutes: number;
  playingSeconds: number;
  overheadSeconds: number;
  greetingSeconds: number;
  extraSeconds: number;
  writeUpSeconds: number;
  /** The slowest plausible selection the plan assumes: one entry per request asked. */
  assumed: { lineId: string; kind: RequirementLine['kind']; seconds: number }[];
}

const DEFAULTS = {
  perRequestOverheadSeconds: 20,
  greetingSeconds: 60,
  writeUpGapMinutes: 0,
  extraTimePercent: 0,
};

function nonNegative(name: string, v: number): number {
  if (!Number.isFinite(v) || v < 0)
    throw new RangeError(`${name} must be a number ≥ 0, got ${String(v)}.`);
  return v;
}

/**
 * The time one slot needs, worked out on the cautious side so a candidate is never rushed:
 *
 * - Slowest plausible draw: each line at its longest request (most octaves, up and down when the
 *   line allows it, at its set tempo, slowed by a tempo substitution); the rule's minimum per kind
 *   taken from the longest lines of that kind, the rest from the longest lines overall, no line
 *   giving more requests than it has different ones.
 * - Each request adds the overhead; the slot adds the greeting.
 * - Extra time (access arrangement) lengthens the candidate's part — playing, overhead, greeting —
 *   not the examiner's write-up gap, which is added last.
 * - The sum is rounded up to a whole minute.
 */
export function planSlot(
  list: Pick<RequirementListVersion, 'lines' | 'selectionRule'>,
  options: SlotPlanOptions = {},
): SlotPlan {
  const overhead = nonNegative(
    'perRequestOverheadSeconds',
    options.perRequestOverheadSeconds ?? DEFAULTS.perRequestOverheadSeconds,
  );
  const greeting = nonNegative(
    'greetingSeconds',
    options.greetingSeconds ?? DEFAULTS.greetingSeconds,
  );
  const writeUp =
    nonNegative('writeUpGapMinutes', options.writeUpGapMinutes ?? DEFAULTS.writeUpGapMinutes) * 60;
  const extraPct = nonNegative(
    'extraTimePercent',
    options.extraTimePercent ?? DEFAULTS.extraTimePercent,
  );
  const rule = options.rule ?? list.selectionRule;
  const subs = options.substitutions ?? [];

  type Item = { line: RequirementLine; seconds: number; playing: number; requests: number };
  const items: Item[] = [];
  for (const line of list.lines) {
    const applies = (s: Substitution) => !s.appliesTo || s.appliesTo.includes(line.kind);
    const counted = isCountedKind(line.kind);
    const maxOct = subs
      .filter((s) => s.type === 'max_octaves' && applies(s))
      .reduce((m, s) => Math.min(m, s.type === 'max_octaves' ? s.octaves : m), Infinity);
    const octaves = counted ? Math.min(Math.max(...line.octaves), maxOct) : 1;
    const direction =
      !line.directions || line.directions.length === 0 || line.directions.includes('up_down')
        ? 'up_down'
        : 'up';
    const pct = subs
      .filter((s) => s.type === 'tempo_percent' && applies(s))
      .reduce((p, s) => (s.type === 'tempo_percent' ? (p * s.percent) / 100 : p), 1);
    let playing: number;
    try {
      playing = itemDurationSeconds({
        kind: line.kind,
        octaves,
        direction,
        tempo: { bpm: line.tempo.bpm * pct, notesPerBeat: line.tempo.notesPerBeat },
        durationSeconds: line.durationSeconds ?? null,
      });
    } catch (e) {
      throw new RangeError(`Line "${line.label ?? line.id}": ${(e as Error).message}`);
    }
    // Hands separately: a line that may be asked hands together may cost two requests.
    const split =
      line.hands.includes('HT') && subs.some((s) => s.type === 'hands_separately' && applies(s))
        ? 2
        : 1;
    const n = lineRequestCount(line);
    for (let i = 0; i < n; i++)
      items.push({
        line,
        playing: playing * split,
        seconds: (playing + overhead) * split,
        requests: split,
      });
  }

  const byLongest = (a: Item, b: Item) => b.seconds - a.seconds;
  const chosen: Item[] = [];
  const taken = new Set<Item>();
  for (const kind of REQUEST_KINDS) {
    const min = rule.minPerKind[kind] ?? 0;
    const pool = items.filter((i) => i.line.kind === kind).sort(byLongest);
    if (pool.length < min)
      throw new RangeError(
        `The rule asks for ${min} ${kind} request(s); the list offers ${pool.length}.`,
      );
    for (const it of pool.slice(0, min)) {
      chosen.push(it);
      taken.add(it);
    }
  }
  const rest = items.filter((i) => !taken.has(i)).sort(byLongest);
  const need = rule.count - chosen.length;
  if (rest.length < need)
    throw new RangeError(
      `The rule asks for ${rule.count} requests; the list offers ${items.length}.`,
    );
  chosen.push(...rest.slice(0, need));

  const playingSeconds = chosen.reduce((s, i) => s + i.playing, 0);
  const overheadSeconds = chosen.reduce((s, i) => s + overhead * i.requests, 0);
  const candidatePart = playingSeconds + overheadSeconds + greeting;
  const extraSeconds = (candidatePart * extraPct) / 100;
  const totalSeconds = candidatePart + extraSeconds + writeUp;
  return {
    // Tolerance so 600.0000000001 s stays 10 minutes.
    minutes: Math.ceil(totalSeconds / 60 - 1e-9),
    playingSeconds,
    overheadSeconds,
    greetingSeconds: greeting,
    extraSeconds,
    writeUpSeconds: writeUp,
    assumed: chosen.map((i) => ({ lineId: i.line.id, kind: i.line.kind, seconds: i.seconds })),
  };
}

/** Suggested slot length in whole minutes (see planSlot for the assumptions). */
export function planSlotMinutes(
  list: Pick<RequirementListVersion, 'lines' | 'selectionRule'>,
  options: SlotPlanOptions = {},
): number {
  return planSlot(list, options).minutes;
}

// ---------- Layout of a sitting's day ----------

/** A clock time as minutes from the local midnight of the sitting's date: "09:30" → 570. */
export function parseClock(text: string): number {
  const m = /^([01]?\d|2[0-3]):([0-5]\d)$/.exec(text.trim());
  if (!m) throw new RangeError(`"${text}" is not a time of day (use HH:MM, e.g. 09:30).`);
  return Number(m[1]) * 60 + Number(m[2]);
}

/** Minutes from local midnight as "HH:MM" (24-hour); 1440 and beyond are refused. */
export function formatClock(minutes: number): string {
  if (!Number.isInteger(minutes) || minutes < 0 || minutes >= 24 * 60)
    throw new RangeError(`${String(minutes)} is not a minute of the day.`);
  return `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`;
}

type Clock = number | string;
const toMinutes = (c: Clock) => (typeof c === 'string' ? parseClock(c) : c);

export interface LayoutCandidate {
  id: string;
  /** This candidate's own slot length (e.g. planSlotMinutes with their extra time); wins over the rest. */
  slotMinutes?: number;
  /** Extra time in percent applied to the base slot length, rounded up to a whole minute. */
  extraTimePercent?: number;
  /** Rest breaks from an access arrangement, added to the slot. */
  restBreakMinutes?: number;
}

export interface LayoutInput {
  /** When the first slot may start: "09:00" or minutes from local midnight. */
  dayStart: Clock;
  /** When the last slot must have ended; none means no limit. */
  dayEnd?: Clock;
  /** Base slot length in minutes (write-up gap included). */
  slotMinutes: number;
  /** Minutes between one slot's end and the next start. Default 0. */
  changeoverMinutes?: number;
  breaks?: readonly { start: Clock; end: Clock; label?: string }[];
  /** In the order they should be seen. */
  candidates: readonly LayoutCandidate[];
}

export interface PlannedSlot {
  id: string;
  /** Minutes from local midnight; the API turns them into instants in the organisation's time zone. */
  start: number;
  end: number;
  minutes: number;
  startTime: string;
  endTime: string;
}

export interface Layout {
  slots: PlannedSlot[];
  /** Candidates that do not fit before the day's end, in order (none after the first that does not fit). */
  unplaced: string[];
}

/**
 * Lays candidates out in order from the day's start. Times are minutes from the local midnight of
 * the sitting's date (wall-clock, not instants), so a day on which the clocks change keeps its
 * local times; the API converts them with the organisation's IANA time zone. A slot never overlaps
 * a break: it moves to the break's end. When a slot would end after the day's end, it and every
 * later candidate are returned as unplaced, so the order the teacher chose is kept.
 */
export function layoutSlots(input: LayoutInput): Layout {
  const dayStart = toMinutes(input.dayStart);
  const dayEnd = input.dayEnd === undefined ? 24 * 60 : toMinutes(input.dayEnd);
  if (dayEnd <= dayStart) throw new RangeError('The day must end after it starts.');
  const base = input.slotMinutes;
  if (!Number.isInteger(base) || base < 1)
    throw new RangeError(`slotMinutes must be a whole number ≥ 1, got ${String(base)}.`);
  const changeover = input.changeoverMinutes ?? 0;
  if (!Number.isInteger(changeover) || changeover < 0)
    throw new RangeError('changeoverMinutes must be a whole number ≥ 0.');
  const breaks = (input.breaks ?? [])
    .map((b) => ({ start: toMinutes(b.start), end: toMinutes(b.end) }))
    .sort((a, b) => a.start - b.start);
  for (const b of breaks)
    if (b.end <= b.start)
      throw new RangeError(`A break must end after it starts (${formatClock(b.start)}).`);
  const ids = new Set<string>();

  const slots: PlannedSlot[] = [];
  const unplaced: string[] = [];
  let cursor = dayStart;
  for (const c of input.candidates) {
    if (ids.has(c.id)) throw new RangeError(`Candidate "${c.id}" is listed twice.`);
    ids.add(c.id);
    if (unplaced.length > 0) {
      unplaced.push(c.id);
      continue;
    }
    const extra = c.extraTimePercent ?? 0;
    const rest = c.restBreakMinutes ?? 0;
    if (extra < 0 || rest < 0)
      throw new RangeError(`Candidate "${c.id}": extra time and rest breaks cannot be negative.`);
    const own = c.slotMinutes ?? Math.ceil((base * (100 + extra)) / 100 - 1e-9);
    if (!Number.isInteger(own) || own < 1)
      throw new RangeError(`Candidate "${c.id}": slotMinutes must be a whole number ≥ 1.`);
    const minutes = own + Math.ceil(rest);
    let start = cursor;
    for (const b of breaks) if (start < b.end && start + minutes > b.start) start = b.end;
    const end = start + minutes;
    if (end > dayEnd) {
      unplaced.push(c.id);
      continue;
    }
    slots.push({
      id: c.id,
      start,
      end,
      minutes,
      startTime: formatClock(start),
      endTime: end === 24 * 60 ? '24:00' : formatClock(end),
    });
    cursor = end + changeover;
  }
  return { slots, unplaced };
}

/** Whether two half-open intervals [start, end) overlap: back-to-back slots do not. */
export function intervalsOverlap(
  a: { start: number; end: number },
  b: { start: number; end: number },
): boolean {
  return a.start < b.end && b.start < a.end;
}
