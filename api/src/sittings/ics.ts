// iCalendar files (RFC 5545) for sitting invitations and downloads. Times are written with the
// organisation's zone as TZID, with a VTIMEZONE built from the zone's real offsets (through Intl)
// for the years the events fall in, so a calendar shows the same local times as Stavemark even on
// a day the clocks change. No external data: the transitions are found by asking Intl.
import { zoneOffsetMinutes } from './zoned-time.js';

export interface IcsEvent {
  /** Globally unique and stable for the slot, so a changed invitation replaces the old one. */
  uid: string;
  /** RFC 5545 SEQUENCE: higher when the event changed. */
  sequence: number;
  start: Date;
  end: Date;
  summary: string;
  location?: string;
  description?: string;
  status?: 'CONFIRMED' | 'CANCELLED';
}

export interface IcsCalendar {
  timeZone: string;
  /** DTSTAMP: when this file was made. */
  stamp: Date;
  events: readonly IcsEvent[];
}

export const ICS_PRODID = '-//Stavemark//Sittings 1.0//EN';
const CRLF = '\r\n';
const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** TEXT value escaping (RFC 5545 §3.3.11): backslash, semicolon, comma and line breaks. */
export function escapeText(s: string): string {
  return s
    .replace(/\\/g, '\\\\')
    .replace(/;/g, '\\;')
    .replace(/,/g, '\\,')
    .replace(/\r\n|\r|\n/g, '\\n');
}

/**
 * Content lines are folded so no line is longer than 75 octets, CRLF then one space (RFC 5545
 * §3.1), never splitting a UTF-8 character.
 */
export function foldLine(line: string): string {
  const out: string[] = [];
  let current = '';
  let octets = 0;
  const limit = () => (out.length === 0 ? 75 : 74); // continuation lines start with a space
  for (const ch of line) {
    const n = Buffer.byteLength(ch, 'utf8');
    if (octets + n > limit()) {
      out.push(current);
      current = '';
      octets = 0;
    }
    current += ch;
    octets += n;
  }
  out.push(current);
  return out.join(`${CRLF} `);
}

/** UTC as 20261201T093000Z (DTSTAMP is always UTC). */
export function utcStamp(d: Date): string {
  return `${d.getUTCFullYear()}${pad(d.getUTCMonth() + 1)}${pad(d.getUTCDate())}T${pad(d.getUTCHours())}${pad(d.getUTCMinutes())}${pad(d.getUTCSeconds())}Z`;
}

/** The wall clock at `instant` with a given offset, as 20261201T093000 (a "floating" form for TZID). */
function wallAt(instant: Date, offsetMinutes: number): string {
  return utcStamp(new Date(instant.getTime() + offsetMinutes * 60_000)).slice(0, -1);
}

function utcOffset(minutes: number): string {
  const sign = minutes < 0 ? '-' : '+';
  const m = Math.abs(minutes);
  return `${sign}${pad(Math.floor(m / 60))}${pad(m % 60)}`;
}

function zoneName(instant: Date, timeZone: string): string | null {
  const part = new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'short' })
    .formatToParts(instant)
    .find((p) => p.type === 'timeZoneName')?.value;
  // Only short letter names (GMT, BST, CET); "GMT+1" says nothing a TZOFFSETTO does not.
  return part && /^[A-Z]{2,5}$/.test(part) ? part : null;
}

/** Instants in [from, to) at which the zone's offset changes, each to the minute. */
export function offsetTransitions(timeZone: string, from: Date, to: Date): { at: Date; from: number; to: number }[] {
  const found: { at: Date; from: number; to: number }[] = [];
  const step = 6 * 3600_000; // no zone changes its offset twice within six hours
  let t = from.getTime();
  let offset = zoneOffsetMinutes(from, timeZone);
  while (t < to.getTime()) {
    const next = Math.min(t + step, to.getTime());
    const o = zoneOffsetMinutes(new Date(next), timeZone);
    if (o !== offset) {
      let lo = t;
      let hi = next; // offset(lo) = old, offset(hi) = new
      while (hi - lo > 60_000) {
        const mid = lo + Math.floor((hi - lo) / 120_000) * 60_000;
        if (zoneOffsetMinutes(new Date(mid), timeZone) === offset) lo = mid;
        else hi = mid;
      }
      found.push({ at: new Date(hi), from: offset, to: o });
      offset = o;
    }
    t = next;
  }
  return found;
}

/**
 * A VTIMEZONE for the zone over [from, to): one observance from `from`, then one per change of
 * offset, each with DTSTART in the local time before the change (RFC 5545 §3.6.5). Observances
 * with a larger offset than the zone's smallest in the range are DAYLIGHT, the rest STANDARD.
 */
export function vtimezoneLines(timeZone: string, from: Date, to: Date): string[] {
  const transitions = offsetTransitions(timeZone, from, to);
  const first = zoneOffsetMinutes(from, timeZone);
  const standard = Math.min(first, ...transitions.map((t) => t.to));
  const observance = (at: Date, fromOffset: number, toOffset: number): string[] => {
    const kind = toOffset > standard ? 'DAYLIGHT' : 'STANDARD';
    const name = zoneName(new Date(at.getTime() + 1), timeZone);
    return [
      `BEGIN:${kind}`,
      `DTSTART:${wallAt(at, fromOffset)}`,
      `TZOFFSETFROM:${utcOffset(fromOffset)}`,
      `TZOFFSETTO:${utcOffset(toOffset)}`,
      ...(name ? [`TZNAME:${name}`] : []),
      `END:${kind}`,
    ];
  };
  return [
    'BEGIN:VTIMEZONE',
    `TZID:${timeZone}`,
    ...observance(from, first, first),
    ...transitions.flatMap((t) => observance(t.at, t.from, t.to)),
    'END:VTIMEZONE',
  ];
}

/** A whole calendar file: VCALENDAR with VERSION and PRODID, the VTIMEZONE, one VEVENT per event. */
export function buildIcs(cal: IcsCalendar): string {
  const tz = cal.timeZone;
  const years = cal.events.flatMap((e) => [e.start.getUTCFullYear(), e.end.getUTCFullYear()]);
  const fromYear = years.length ? Math.min(...years) : cal.stamp.getUTCFullYear();
  const toYear = years.length ? Math.max(...years) : fromYear;
  // From the start of the year before the first event, so a zone's whole cycle is covered.
  const from = new Date(Date.UTC(fromYear - 1, 0, 1));
  const to = new Date(Date.UTC(toYear + 1, 0, 1));
  const local = (d: Date) => `;TZID=${tz}:${wallAt(d, zoneOffsetMinutes(d, tz))}`;
  const lines = [
    'BEGIN:VCALENDAR',
    'VERSION:2.0',
    `PRODID:${ICS_PRODID}`,
    'CALSCALE:GREGORIAN',
    'METHOD:PUBLISH',
    ...vtimezoneLines(tz, from, to),
    ...cal.events.flatMap((e) => [
      'BEGIN:VEVENT',
      `UID:${e.uid}`,
      `DTSTAMP:${utcStamp(cal.stamp)}`,
      `DTSTART${local(e.start)}`,
      `DTEND${local(e.end)}`,
      `SEQUENCE:${e.sequence}`,
      `SUMMARY:${escapeText(e.summary)}`,
      ...(e.location ? [`LOCATION:${escapeText(e.location)}`] : []),
      ...(e.description ? [`DESCRIPTION:${escapeText(e.description)}`] : []),
      `STATUS:${e.status ?? 'CONFIRMED'}`,
      'TRANSP:OPAQUE',
      'END:VEVENT',
    ]),
    'END:VCALENDAR',
  ];
  return lines.map(foldLine).join(CRLF) + CRLF;
}
