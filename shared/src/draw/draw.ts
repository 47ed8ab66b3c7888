// The seeded draw of requests from a requirement list (design.md §4.4).
import {
  isCountedKind,
  isInvertibleKind,
  isModalKind,
  REQUEST_KINDS,
  type Hands,
  type Inversion,
  type Mode,
  type Motion,
  type Request,
  type RequestKind,
  type RequirementLine,
  type RequirementListVersion,
  type SelectionRule,
  type Substitution,
} from '../music/domain.js';
import { normaliseKeyName } from '../music/keys.js';
import { randomIndex, seededRandom, type Seed } from './prng.js';

/** The fields that make two requests "the same request" for avoiding repeats. */
export type RequestIdentityFields = Pick<
  Request,
  'kind' | 'key' | 'mode' | 'hands' | 'motion' | 'inversion' | 'title'
>;

/**
 * Identity of a request: kind, key, mode, hands, motion, inversion and title. Octaves, direction,
 * articulation and dynamics are left out: D major HT legato and D major HT staccato count as a
 * repeat for the candidate.
 */
export function requestIdentity(r: RequestIdentityFields): string {
  const key = r.key === null ? '' : normaliseKeyName(r.key);
  return [
    r.kind,
    key,
    r.mode ?? '',
    r.hands,
    r.motion ?? '',
    r.inversion ?? '',
    r.title ?? '',
  ].join('|');
}

export interface DrawOptions {
  /** The candidate's previous requests (e.g. last sitting's draw): avoided where the pool allows. */
  previous?: readonly RequestIdentityFields[];
  /** Approved substitutions from the candidate's access arrangement. */
  substitutions?: readonly Substitution[];
}

export interface DrawResult {
  /** The seed as given, stored with the slot so the draw can be replayed. */
  seed: Seed;
  algorithm: 'mulberry32/fnv1a32 v1';
  /** Requests in asking order, after substitutions (a hands-separately substitution gives two). */
  requests: Request[];
  /** How many drawn requests repeat a previous one because nothing else was left. */
  repeatsOfPrevious: number;
}

export class DrawError extends Error {
  constructor(
    readonly code: 'invalid_rule' | 'not_enough_requests' | 'invalid_substitution',
    message: string,
  ) {
    super(message);
    this.name = 'DrawError';
  }
}

interface Core {
  line: RequirementLine;
  key: string | null;
  mode: Mode | null;
  hands: Hands;
  motion: Motion | null;
  inversion: Inversion | null;
  title: string | null;
  identity: string;
}

/** Every distinct request a line can give, ignoring octaves, direction, articulation and dynamics. */
function coresOf(line: RequirementLine): Core[] {
  const counted = isCountedKind(line.kind);
  const keys: (string | null)[] = counted ? line.keys.map(normaliseKeyName) : [null];
  const titles: (string | null)[] = counted ? [null] : (line.titles ?? []);
  const modes: (Mode | null)[] = isModalKind(line.kind) ? line.modes : [null];
  const inversions: (Inversion | null)[] =
    isInvertibleKind(line.kind) && line.inversions.length > 0 ? line.inversions : [null];
  const out: Core[] = [];
  for (const key of keys)
    for (const title of titles)
      for (const mode of modes)
        for (const hands of line.hands) {
          const motions: (Motion | null)[] =
            hands === 'HT' && counted
              ? line.motions.length > 0
                ? line.motions
                : ['similar']
              : [null];
          for (const motion of motions)
            for (const inversion of inversions) {
              const core = { line, key, mode, hands, motion, inversion, title, kind: line.kind };
              out.push({
                line,
                key,
                mode,
                hands,
                motion,
                inversion,
                title,
                identity: requestIdentity(core),
              });
            }
        }
  return out;
}

/** How many different requests a line can give (its pool for the draw). */
export function lineRequestCount(line: RequirementLine): number {
  return new Set(coresOf(line).map((c) => c.identity)).size;
}

function pickOne<T>(rand: () => number, items: readonly T[]): T {
  return items[randomIndex(rand, items.length)] as T;
}

/** The items with the smallest score; ties are all kept so the generator decides among them. */
function best<T>(items: readonly T[], score: (t: T) => number): T[] {
  let min = Infinity;
  let out: T[] = [];
  for (const t of items) {
    const s = score(t);
    if (s < min) {
      min = s;
      out = [t];
    } else if (s === min) out.push(t);
  }
  return out;
}

function checkRule(rule: SelectionRule): void {
  if (!Number.isInteger(rule.count) || rule.count < 1)
    throw new DrawError(
      'invalid_rule',
      `The rule must ask at least one request (count ${String(rule.count)}).`,
    );
  let sum = 0;
  for (const [kind, min] of Object.entries(rule.minPerKind)) {
    if (!(REQUEST_KINDS as readonly string[]).includes(kind))
      throw new DrawError('invalid_rule', `Unknown kind "${kind}" in the rule.`);
    if (!Number.isInteger(min) || (min ?? 0) < 0)
      throw new DrawError('invalid_rule', `Minimum for ${kind} must be a whole number ≥ 0.`);
    sum += min ?? 0;
  }
  if (sum > rule.count)
    throw new DrawError(
      'invalid_rule',
      `The minimums add up to ${sum}, more than the ${rule.count} requests asked.`,
    );
}

/**
 * Draws the requests for one candidate, replayably: the same list, rule, seed and options always
 * give the same draw (generator: mulberry32 seeded through FNV-1a, see prng.ts).
 *
 * - The rule is always honoured: exactly `count` requests, at least `minPerKind` of each kind, no
 *   request twice; when the list cannot give that, a DrawError says why.
 * - Kinds are spread: after the minimums, each further request goes to the kind drawn least so far.
 * - Difficulty is spread: within a kind, lines whose difficulty weight has been drawn least come
 *   first, then lines used least; so a draw covers the range of weights the list offers.
 * - Keys are spread: a key already in the draw is chosen again only when nothing else is left.
 * - The candidate's previous requests are avoided while any other request of that line remains.
 * - Substitutions are applied last, to the drawn requests (hands separately makes two requests).
 * - Requests are returned grouped by kind, in the order of REQUEST_KINDS, so the examiner can ask
 *   them in a natural sequence.
 */
export function drawRequests(
  list: Pick<RequirementListVersion, 'lines'>,
  rule: SelectionRule,
  seed: Seed,
  options: DrawOptions = {},
): DrawResult {
  checkRule(rule);
  const rand = seededRandom(seed);
  const previous = new Set((options.previous ?? []).map(requestIdentity));

  const coresByLine = new Map<RequirementLine, Core[]>();
  const identitiesByKind = new Map<RequestKind, Set<string>>();
  for (const line of list.lines) {
    const cores = coresOf(line);
    coresByLine.set(line, cores);
    const set = identitiesByKind.get(line.kind) ?? new Set<string>();
    for (const c of cores) set.add(c.identity);
    identitiesByKind.set(line.kind, set);
  }
  const available = (kind: RequestKind) => identitiesByKind.get(kind)?.size ?? 0;

  for (const [kind, min] of Object.entries(rule.minPerKind) as [RequestKind, number][]) {
    if (min > available(kind)) {
      throw new DrawError(
        'not_enough_requests',
        `The rule asks for at least ${min} ${kind} request(s), but the list offers only ${available(kind)} different one(s).`,
      );
    }
  }
  const total = [...identitiesByKind.values()].reduce((s, set) => s + set.size, 0);
  if (total < rule.count) {
    throw new DrawError(
      'not_enough_requests',
      `The rule asks for ${rule.count} requests, but the list offers only ${total} different one(s).`,
    );
  }

  const used = new Set<string>();
  const kindCount = new Map<RequestKind, number>();
  const lineCount = new Map<RequirementLine, number>();
  const weightCount = new Map<string, number>(); // per kind and weight
  const keysUsed = new Map<string, number>();
  const drawn: Core[] = [];
  let repeatsOfPrevious = 0;

  const remaining = (kind: RequestKind) => {
    let n = 0;
    for (const id of identitiesByKind.get(kind) ?? []) if (!used.has(id)) n++;
    return n;
  };

  const drawOne = (kind: RequestKind) => {
    const lines = list.lines.filter(
      (l) => l.kind === kind && (coresByLine.get(l) ?? []).some((c) => !used.has(c.identity)),
    );
    const byWeight = best(lines, (l) => weightCount.get(`${kind}:${l.difficultyWeight}`) ?? 0);
    const line = pickOne(
      rand,
      best(byWeight, (l) => lineCount.get(l) ?? 0),
    );
    const open = (coresByLine.get(line) ?? []).filter((c) => !used.has(c.identity));
    const fresh = open.filter((c) => !previous.has(c.identity));
    const pool = fresh.length > 0 ? fresh : open;
    if (fresh.length === 0) repeatsOfPrevious++;
    const core = pickOne(
      rand,
      best(pool, (c) => (c.key === null ? 0 : (keysUsed.get(c.key) ?? 0))),
    );
    used.add(core.identity);
    drawn.push(core);
    kindCount.set(kind, (kindCount.get(kind) ?? 0) + 1);
    lineCount.set(line, (lineCount.get(line) ?? 0) + 1);
    weightCount.set(
      `${kind}:${line.difficultyWeight}`,
      (weightCount.get(`${kind}:${line.difficultyWeight}`) ?? 0) + 1,
    );
    if (core.key !== null) keysUsed.set(core.key, (keysUsed.get(core.key) ?? 0) + 1);
  };

  // Minimums first (in a fixed kind order, so the draw does not depend on object key order).
  for (const kind of REQUEST_KINDS) {
    for (let i = 0; i < (rule.minPerKind[kind] ?? 0); i++) drawOne(kind);
  }
  // Then spread: the kind drawn least so far among those with requests left.
  while (drawn.length < rule.count) {
    const kinds = REQUEST_KINDS.filter((k) => remaining(k) > 0);
    drawOne(
      pickOne(
        rand,
        best(kinds, (k) => kindCount.get(k) ?? 0),
      ),
    );
  }

  const order = (k: RequestKind) => REQUEST_KINDS.indexOf(k);
  const sorted = drawn
    .map((core, i) => ({ core, i }))
    .sort((a, b) => order(a.core.line.kind) - order(b.core.line.kind) || a.i - b.i)
    .map(({ core }) => toRequest(core, rand));
  const requests = applySubstitutions(sorted, options.substitutions ?? []).map((r, index) => ({
    ...r,
    index,
  }));
  return { seed, algorithm: 'mulberry32/fnv1a32 v1', requests, repeatsOfPrevious };
}

function toRequest(core: Core, rand: () => number): Request {
  const { line } = core;
  const counted = isCountedKind(line.kind);
  const octaves = counted && line.octaves.length > 0 ? pickOne(rand, line.octaves) : 1;
  const directions =
    line.directions && line.directions.length > 0 ? line.directions : (['up_down'] as const);
  return {
    index: 0,
    lineId: line.id,
    kind: line.kind,
    key: core.key,
    mode: core.mode,
    hands: core.hands,
    motion: core.motion,
    octaves,
    direction: pickOne(rand, directions),
    articulation: line.articulations.length > 0 ? pickOne(rand, line.articulations) : null,
    dynamic: line.dynamics.length > 0 ? pickOne(rand, line.dynamics) : null,
    inversion: core.inversion,
    tempo: { ...line.tempo },
    rubricVersionId: line.rubricVersionId,
    difficultyWeight: line.difficultyWeight,
    title: core.title,
    durationSeconds: line.durationSeconds ?? null,
    substitution: null,
  };
}

/**
 * Applies approved substitutions in a fixed order: octave and tempo limits first, then the hands
 * substitution (hands separately: RH then LH as two requests; single hand: the named hand). Each
 * changed request records what it was before. Throws when two hands substitutions conflict.
 */
export function applySubstitutions(
  requests: readonly Request[],
  substitutions: readonly Substitution[],
): Request[] {
  const handsSubs = substitutions.filter(
    (s) => s.type === 'hands_separately' || s.type === 'single_hand',
  );
  for (const s of substitutions) {
    if (s.type === 'max_octaves' && (!Number.isInteger(s.octaves) || s.octaves < 1)) {
      throw new DrawError(
        'invalid_substitution',
        `max_octaves needs a whole number of octaves ≥ 1, got ${String(s.octaves)}.`,
      );
    }
    if (s.type === 'tempo_percent' && !(s.percent > 0 && s.percent <= 100)) {
      throw new DrawError(
        'invalid_substitution',
        `tempo_percent must be above 0 and at most 100, got ${String(s.percent)}.`,
      );
    }
  }
  const applies = (s: Substitution, r: Request) => !s.appliesTo || s.appliesTo.includes(r.kind);
  const out: Request[] = [];
  for (const r of requests) {
    const original = { hands: r.hands, motion: r.motion, octaves: r.octaves, bpm: r.tempo.bpm };
    let cur: Request = { ...r, tempo: { ...r.tempo } };
    const applied: Substitution['type'][] = [];
    for (const s of substitutions) {
      if (!applies(s, cur)) continue;
      if (s.type === 'max_octaves' && cur.octaves > s.octaves && isCountedKind(cur.kind)) {
        cur = { ...cur, octaves: s.octaves };
        applied.push(s.type);
      } else if (s.type === 'tempo_percent' && s.percent < 100) {
        cur = { ...cur, tempo: { ...cur.tempo, bpm: Math.round(cur.tempo.bpm * s.percent) / 100 } };
        applied.push(s.type);
      }
    }
    const handsFor = handsSubs.filter((s) => applies(s, cur));
    if (handsFor.length > 1) {
      throw new DrawError(
        'invalid_substitution',
        `More than one hands substitution applies to ${cur.kind}: keep one.`,
      );
    }
    const hs = handsFor[0];
    if (hs && cur.hands === 'HT') {
      const hands: ('RH' | 'LH')[] =
        hs.type === 'hands_separately'
          ? ['RH', 'LH']
          : [hs.type === 'single_hand' ? hs.hand : 'RH'];
      for (const hand of hands)
        out.push({
          ...cur,
          hands: hand,
          motion: null,
          substitution: { types: [...applied, hs.type], original },
        });
      continue;
    }
    out.push(applied.length > 0 ? { ...cur, substitution: { types: applied, original } } : cur);
  }
  return out;
}
