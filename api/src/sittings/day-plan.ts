// The layout of one sitting's day and each candidate's slot length (issue 5 §1–§3). Pure, so the
// service, the seed and the tests share it. Minutes are counted from the local midnight of the
// sitting's date, like the shared layoutSlots; the service turns them into instants.
import { formatClock, intervalsOverlap, planSlotMinutes, type RequirementListVersion, type Substitution } from '@stavemark/shared';

export interface DayBreak {
  start: number;
  end: number;
  label?: string;
}

export interface DayPlanSlot {
  id: string;
  /** Who it is, for messages ("Ada Pendry"). */
  name: string;
  minutes: number;
  /** Start no earlier than this (a start time the teacher chose). */
  notBefore?: number | null;
}

export interface DayPlanInput {
  dayStart: number;
  dayEnd: number;
  changeoverMinutes: number;
  breaks: readonly DayBreak[];
  /** In the order of the day. */
  slots: readonly DayPlanSlot[];
}

export type DayPlanProblemKind = 'past_day_end' | 'inside_break' | 'before_day_start';

export interface DayPlanProblem {
  slotId: string;
  kind: DayPlanProblemKind;
  message: string;
}

export interface PlacedSlot {
  id: string;
  start: number;
  end: number;
}

const span = (s: number, e: number) => `${formatClock(s)}–${e >= 1440 ? '24:00' : formatClock(e)}`;

/**
 * Lays the slots out in order: each starts when the one before has ended (plus the changeover),
 * or at its chosen time if later, and a slot that would run into a break waits for its end. A
 * slot given a start time of its own that falls in a break is a problem, not moved; so is a slot
 * that ends after the day's end. Every slot is placed, so all problems are reported at once.
 */
export function planDay(input: DayPlanInput): { placed: PlacedSlot[]; problems: DayPlanProblem[] } {
  const breaks = [...input.breaks].sort((a, b) => a.start - b.start);
  const placed: PlacedSlot[] = [];
  const problems: DayPlanProblem[] = [];
  let cursor = input.dayStart;
  for (const slot of input.slots) {
    const chosen = slot.notBefore ?? null;
    if (chosen !== null && chosen < input.dayStart) {
      problems.push({
        slotId: slot.id,
        kind: 'before_day_start',
        message: `${slot.name}'s chosen start ${formatClock(chosen)} is before the day starts (${formatClock(input.dayStart)}).`,
      });
    }
    let start = Math.max(cursor, chosen ?? cursor);
    const explicit = chosen !== null && start === chosen;
    for (const b of breaks) {
      if (!intervalsOverlap({ start, end: start + slot.minutes }, b)) continue;
      if (explicit) {
        problems.push({
          slotId: slot.id,
          kind: 'inside_break',
          message: `${slot.name}'s slot at ${span(start, start + slot.minutes)} would fall in the break ${span(b.start, b.end)}${b.label ? ` (${b.label})` : ''}: choose another start time.`,
        });
        break;
      }
      start = b.end;
    }
    const end = start + slot.minutes;
    if (end > input.dayEnd) {
      problems.push({
        slotId: slot.id,
        kind: 'past_day_end',
        message: `${slot.name}'s slot would run ${span(start, end)}, past the end of the day at ${formatClock(input.dayEnd)}.`,
      });
    }
    placed.push({ id: slot.id, start, end });
    cursor = end + input.changeoverMinutes;
  }
  return { placed, problems };
}

export interface CandidateLengthInput {
  list: Pick<RequirementListVersion, 'lines' | 'selectionRule'>;
  writeUpGapMinutes: number;
  /** The teacher's fixed length for the grade (write-up gap included), or null. */
  fixedMinutes: number | null;
  extraTimePercent: number;
  restBreakMinutes: number;
  substitutions: readonly Substitution[];
}

/** The paper's own length with no access arrangement: the fixed one or planSlotMinutes. */
export function paperMinutes(list: CandidateLengthInput['list'], writeUpGapMinutes: number, fixedMinutes: number | null): number {
  return fixedMinutes ?? planSlotMinutes(list, { writeUpGapMinutes });
}

/**
 * One candidate's slot length. Extra time lengthens the candidate's part, never the examiner's
 * write-up gap (as planSlot does); rest breaks are added whole. With a suggested length the
 * substitutions count too (hands separately asks more); a fixed length is the teacher's call.
 */
export function candidateMinutes(c: CandidateLengthInput): number {
  let own: number;
  if (c.fixedMinutes === null) {
    own = planSlotMinutes(c.list, {
      writeUpGapMinutes: c.writeUpGapMinutes,
      extraTimePercent: c.extraTimePercent,
      substitutions: [...c.substitutions],
    });
  } else {
    const candidatePart = Math.max(1, c.fixedMinutes - c.writeUpGapMinutes);
    // Tolerance so 12 × 1.25 = 15.000000000000002 stays 15.
    own = Math.ceil((candidatePart * (100 + c.extraTimePercent)) / 100 - 1e-9) + c.writeUpGapMinutes;
  }
  return own + c.restBreakMinutes;
}
