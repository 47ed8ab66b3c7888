// Second-marker allocation for double marking (issue 5 §4). Pure: the service supplies who leads
// each slot, who teaches each candidate and who is busy elsewhere at that time.

export interface DoubleMarkSlot {
  id: string;
  /** The slot's first examiner; a slot without one cannot be double-marked yet. */
  primaryId: string | null;
  /** Examiners who teach this candidate (own pupils are avoided when anyone else is free). */
  teachers: ReadonlySet<string>;
  /** Examiners in another sitting at this slot's time. */
  busy: ReadonlySet<string>;
}

export interface SecondMarkerAssignment {
  slotId: string;
  secondId: string | null;
  /** The only free examiner teaches the candidate: needs acknowledging. */
  ownPupil: boolean;
  /** Why no second examiner could be given. */
  reason?: 'no_primary' | 'nobody_free';
}

/** The pair of two examiners, whichever marks first. */
export const pairKey = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`);

/**
 * Which of n slots (in the order of the day) a share in percent selects: k = round(n × share)
 * slots (at least one for any share above 0), spread evenly through the day — the middle of each
 * of k equal runs — so double marking does not bunch at the start.
 */
export function spreadIndices(n: number, sharePercent: number): number[] {
  if (n <= 0 || sharePercent <= 0) return [];
  const k = Math.min(n, Math.max(1, Math.round((n * sharePercent) / 100)));
  return Array.from({ length: k }, (_, i) => Math.floor(((i + 0.5) * n) / k));
}

/**
 * Gives each slot a second examiner, slot by slot, choosing among the free examiners the one whose
 * pair with the first examiner has marked together least in this allocation, then the one with
 * the fewest second markings so far, then the pair that worked together least before (`history`,
 * pair key → count from earlier sittings), then the panel's order. Greedy on those counts, so the
 * pairs stay within one of each other when every examiner is free.
 */
export function allocateSecondMarkers(
  slots: readonly DoubleMarkSlot[],
  examiners: readonly string[],
  history: ReadonlyMap<string, number> = new Map(),
): SecondMarkerAssignment[] {
  const pairs = new Map<string, number>();
  const load = new Map<string, number>();
  const order = new Map(examiners.map((e, i) => [e, i]));
  const out: SecondMarkerAssignment[] = [];
  for (const slot of slots) {
    const primary = slot.primaryId;
    if (!primary) {
      out.push({ slotId: slot.id, secondId: null, ownPupil: false, reason: 'no_primary' });
      continue;
    }
    const free = examiners.filter((e) => e !== primary && !slot.busy.has(e));
    const notTeaching = free.filter((e) => !slot.teachers.has(e));
    const pool = notTeaching.length > 0 ? notTeaching : free;
    if (pool.length === 0) {
      out.push({ slotId: slot.id, secondId: null, ownPupil: false, reason: 'nobody_free' });
      continue;
    }
    const score = (e: string): number[] => [
      pairs.get(pairKey(primary, e)) ?? 0,
      load.get(e) ?? 0,
      history.get(pairKey(primary, e)) ?? 0,
      order.get(e) ?? 0,
    ];
    const best = [...pool].sort((a, b) => {
      const sa = score(a);
      const sb = score(b);
      for (let i = 0; i < sa.length; i++) if (sa[i] !== sb[i]) return sa[i]! - sb[i]!;
      return 0;
    })[0]!;
    pairs.set(pairKey(primary, best), (pairs.get(pairKey(primary, best)) ?? 0) + 1);
    load.set(best, (load.get(best) ?? 0) + 1);
    out.push({ slotId: slot.id, secondId: best, ownPupil: slot.teachers.has(best) });
  }
  return out;
}
