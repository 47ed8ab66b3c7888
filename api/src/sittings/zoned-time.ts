// Wall-clock times of a sitting's day ↔ instants, with the IANA zone through Intl (no zone data
// of our own). The plan is made in minutes from local midnight; storage is timestamptz.
import { formatClock } from '@stavemark/shared';

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    formatters.set(timeZone, f);
  }
  return f;
}

interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

function wallClock(instant: Date, timeZone: string): WallClock {
  const parts = formatter(timeZone).formatToParts(instant);
  const get = (type: Intl.DateTimeFormatPartTypes) => Number(parts.find((p) => p.type === type)?.value);
  return { year: get('year'), month: get('month'), day: get('day'), hour: get('hour'), minute: get('minute'), second: get('second') };
}

/** The zone's offset from UTC at an instant, in minutes (Europe/London in summer: +60). */
export function zoneOffsetMinutes(instant: Date, timeZone: string): number {
  const whole = new Date(Math.floor(instant.getTime() / 1000) * 1000);
  const w = wallClock(whole, timeZone);
  return Math.round((Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) - whole.getTime()) / 60_000);
}

/** An instant as the local date and minutes from local midnight in the zone. */
export function instantToLocal(instant: Date, timeZone: string): { date: string; minutes: number } {
  const w = wallClock(instant, timeZone);
  const date = `${String(w.year).padStart(4, '0')}-${String(w.month).padStart(2, '0')}-${String(w.day).padStart(2, '0')}`;
  return { date, minutes: w.hour * 60 + w.minute };
}

export class NonexistentLocalTime extends Error {}

/**
 * The instant at which the wall clock in the zone shows `minutes` after midnight of `date`.
 * A time skipped when the clocks go forward does not exist and is refused; a time that occurs
 * twice when they go back resolves to its first occurrence.
 */
export function localToInstant(date: string, minutes: number, timeZone: string): Date {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const wall = Date.UTC(y, m - 1, d, 0, minutes);
  // Two rounds: the offset at the guess, then at the corrected instant (they differ near a change).
  let t = wall - zoneOffsetMinutes(new Date(wall), timeZone) * 60_000;
  t = wall - zoneOffsetMinutes(new Date(t), timeZone) * 60_000;
  // For a time that occurs twice, prefer the earlier instant if it shows the same wall clock.
  const earlier = t - 60 * 60_000;
  const target = { date, minutes };
  const same = (x: number) => {
    const l = instantToLocal(new Date(x), timeZone);
    return l.date === target.date && l.minutes === target.minutes;
  };
  if (same(earlier)) return new Date(earlier);
  if (!same(t)) {
    throw new NonexistentLocalTime(`${formatClock(minutes)} does not exist on ${date} in ${timeZone}: the clocks go forward then.`);
  }
  return new Date(t);
}

/** "HH:MM" of an instant in the zone. */
export function clockOf(instant: Date, timeZone: string): string {
  return formatClock(instantToLocal(instant, timeZone).minutes);
}
