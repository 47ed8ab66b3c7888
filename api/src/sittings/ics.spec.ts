import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { buildIcs, escapeText, foldLine, ICS_PRODID, offsetTransitions } from './ics.js';
import { localToInstant } from './zoned-time.js';

// Checked against RFC 5545 (Internet Calendaring and Scheduling Core Object Specification,
// iCalendar): §3.1 content lines (CRLF, folding at 75 octets), §3.3.11 TEXT escaping, §3.4
// VCALENDAR (VERSION and PRODID required), §3.6.1 VEVENT (UID and DTSTAMP required, DTSTART when
// there is no METHOD... we always write it), §3.6.5 VTIMEZONE, §3.8.2.4 DTSTART with TZID.
// Then parsed back by ical.js 2.2.1 (a general-purpose iCalendar library), which converts the
// local times to UTC through our own VTIMEZONE.

const longText =
  'Grade 5, Grade 6; mock exam — Recital Room. Bring your music, arrive ten minutes early, and tell the desk if you need the piano stool adjusted. Ünïcödé: ♯ ♭ ♮ 𝄞 — to test folding at 75 octets without splitting a character.';

function sample() {
  const start = localToInstant('2026-10-25', 9 * 60 + 30, 'Europe/London');
  const end = localToInstant('2026-10-25', 9 * 60 + 42, 'Europe/London');
  const summer = localToInstant('2026-10-24', 9 * 60 + 30, 'Europe/London');
  return buildIcs({
    timeZone: 'Europe/London',
    stamp: new Date('2026-10-01T12:00:00Z'),
    events: [
      { uid: 'slot-1@stavemark', sequence: 2, start, end, summary: 'Mock exam: Ada Pendry, Grade 1', location: 'Room 4, upstairs', description: longText },
      { uid: 'slot-2@stavemark', sequence: 0, start: summer, end: new Date(summer.getTime() + 12 * 60_000), summary: 'Saturday slot' },
    ],
  });
}

/** RFC 5545 §3.1: unfolding removes every CRLF followed by one space or tab. */
const unfold = (text: string) => text.replace(/\r\n[ \t]/g, '');

describe('calendar files (RFC 5545)', () => {
  const text = sample();
  const lines = text.split('\r\n');

  it('uses CRLF line ends only, ends with CRLF, and no line is over 75 octets (§3.1)', () => {
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    for (const l of lines) expect(Buffer.byteLength(l, 'utf8')).toBeLessThanOrEqual(75);
    // the long description really was folded, and unfolds to the escaped text whole
    expect(lines.filter((l) => l.startsWith(' ')).length).toBeGreaterThan(2);
    expect(unfold(text)).toContain(`DESCRIPTION:${escapeText(longText)}`);
  });

  it('never splits a multi-octet character when folding (§3.1)', () => {
    const folded = foldLine(`DESCRIPTION:${'𝄞'.repeat(40)}`);
    for (const part of folded.split('\r\n')) {
      expect(Buffer.byteLength(part, 'utf8')).toBeLessThanOrEqual(75);
      expect(part).not.toContain('\uFFFD');
      expect(Buffer.from(part, 'utf8').toString('utf8')).toBe(part);
    }
    expect(folded.replace(/\r\n /g, '')).toBe(`DESCRIPTION:${'𝄞'.repeat(40)}`);
  });

  it('has VCALENDAR with VERSION:2.0 and PRODID, and each VEVENT UID, DTSTAMP (UTC) and DTSTART (§3.4, §3.6.1)', () => {
    const u = unfold(text).split('\r\n');
    expect(u[0]).toBe('BEGIN:VCALENDAR');
    expect(u.at(-2)).toBe('END:VCALENDAR');
    expect(u).toContain('VERSION:2.0');
    expect(u).toContain(`PRODID:${ICS_PRODID}`);
    const events = unfold(text).split('BEGIN:VEVENT').slice(1);
    expect(events).toHaveLength(2);
    for (const e of events) {
      expect(e).toMatch(/\r\nUID:[^\r\n]+\r\n/);
      expect(e).toMatch(/\r\nDTSTAMP:\d{8}T\d{6}Z\r\n/);
      expect(e).toMatch(/\r\nDTSTART;TZID=Europe\/London:\d{8}T\d{6}\r\n/);
    }
    // the clock-change day keeps its local time: 09:30 on 25 October, not 08:30 or 10:30
    expect(unfold(text)).toContain('DTSTART;TZID=Europe/London:20261025T093000');
    expect(unfold(text)).toContain('DTSTART;TZID=Europe/London:20261024T093000');
  });

  it('escapes TEXT values (§3.3.11)', () => {
    expect(escapeText('a,b;c\\d\ne')).toBe('a\\,b\\;c\\\\d\\ne');
  });

  it('the VTIMEZONE has the real changes of 2025–2027 at 01:00 UTC (Directive 2000/84/EC)', () => {
    const t = offsetTransitions('Europe/London', new Date('2025-01-01T00:00:00Z'), new Date('2028-01-01T00:00:00Z'));
    expect(t.map((x) => `${x.at.toISOString()} ${x.from}→${x.to}`)).toEqual([
      '2025-03-30T01:00:00.000Z 0→60',
      '2025-10-26T01:00:00.000Z 60→0',
      '2026-03-29T01:00:00.000Z 0→60',
      '2026-10-25T01:00:00.000Z 60→0',
      '2027-03-28T01:00:00.000Z 0→60',
      '2027-10-31T01:00:00.000Z 60→0',
    ]);
    // §3.6.5: DTSTART of an observance is in the local time before the change
    expect(unfold(text)).toMatch(/BEGIN:STANDARD\r\nDTSTART:20261025T020000\r\nTZOFFSETFROM:\+0100\r\nTZOFFSETTO:\+0000\r\nTZNAME:GMT\r\nEND:STANDARD/);
    expect(unfold(text)).toMatch(/BEGIN:DAYLIGHT\r\nDTSTART:20260329T010000\r\nTZOFFSETFROM:\+0000\r\nTZOFFSETTO:\+0100\r\nTZNAME:BST\r\nEND:DAYLIGHT/);
  });

  it('ical.js parses it back: same instants (through our VTIMEZONE), texts and sequence', () => {
    const cal = new ICAL.Component(ICAL.parse(text));
    expect(cal.getFirstPropertyValue('version')).toBe('2.0');
    expect(cal.getFirstPropertyValue('prodid')).toBe(ICS_PRODID);
    const [first, second] = cal.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
    expect(first!.uid).toBe('slot-1@stavemark');
    expect(first!.summary).toBe('Mock exam: Ada Pendry, Grade 1');
    expect(first!.location).toBe('Room 4, upstairs');
    expect(first!.description).toBe(longText);
    expect(first!.sequence).toBe(2);
    expect(first!.startDate.zone?.tzid).toBe('Europe/London');
    // 09:30 GMT on the day the clocks went back = 09:30 UTC; the day before, 09:30 BST = 08:30 UTC
    expect(first!.startDate.toJSDate().toISOString()).toBe('2026-10-25T09:30:00.000Z');
    expect(first!.endDate.toJSDate().toISOString()).toBe('2026-10-25T09:42:00.000Z');
    expect(second!.startDate.toJSDate().toISOString()).toBe('2026-10-24T08:30:00.000Z');
    expect(second!.description).toBeNull();
  });

  it('a zone without summer time gets one STANDARD observance', () => {
    const ics = buildIcs({
      timeZone: 'Asia/Kolkata',
      stamp: new Date('2026-01-01T00:00:00Z'),
      events: [{ uid: 'x@stavemark', sequence: 0, start: new Date('2026-07-01T04:30:00Z'), end: new Date('2026-07-01T05:00:00Z'), summary: 'S' }],
    });
    expect(unfold(ics)).toContain('DTSTART;TZID=Asia/Kolkata:20260701T100000');
    expect((unfold(ics).match(/BEGIN:(STANDARD|DAYLIGHT)/g) ?? []).length).toBe(1);
    const ev = new ICAL.Event(new ICAL.Component(ICAL.parse(ics)).getFirstSubcomponent('vevent')!);
    expect(ev.startDate.toJSDate().toISOString()).toBe('2026-07-01T04:30:00.000Z');
  });
});
