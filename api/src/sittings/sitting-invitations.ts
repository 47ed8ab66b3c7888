// Who is told what when a sitting is scheduled or changes (issue 5 §6): the examiners and the
// candidates (a minor's guardians instead), each with their own times and a calendar file. Pure:
// the service takes a snapshot before and after a change, and only those whose times changed hear
// again.
import type { NewMail } from '../mail/mail.service.js';
import { buildIcs, type IcsEvent } from './ics.js';
import { clockOf } from './zoned-time.js';

export interface Recipient {
  address: string;
  name: string;
}

export interface SnapshotSlot {
  id: string;
  startsAt: Date;
  endsAt: Date;
  candidateName: string;
  listName: string;
  examinerId: string | null;
  secondExaminerId: string | null;
  /** The candidate, or their guardians when the candidate is a minor. */
  recipients: Recipient[];
}

export interface InviteSnapshot {
  sittingId: string;
  title: string;
  room: string;
  date: string;
  timeZone: string;
  organisationName: string;
  revision: number;
  slots: SnapshotSlot[];
  examiners: (Recipient & { id: string })[];
}

export type InvitationKind = 'invitation' | 'change' | 'cancellation';

export interface OutgoingInvitation {
  key: string;
  kind: InvitationKind;
  to: Recipient;
  subject: string;
  text: string;
  ics: string;
  filename: string;
}

/** One of these as an OutboundMail row (kind `sitting_<kind>`), its words and calendar file as data. */
export function asOutboundMail(organisationId: string, sittingId: string, m: OutgoingInvitation): NewMail {
  return {
    organisationId,
    sittingId,
    kind: `sitting_${m.kind}`,
    toAddress: m.to.address,
    toName: m.to.name,
    data: { subject: m.subject, text: m.text, ics: m.ics, icsFilename: m.filename },
    accountTokenId: null,
  };
}

interface Facts {
  key: string;
  to: Recipient;
  /** What the recipient was told; a change is worth a message only when this differs. */
  fingerprint: string;
  events: IcsEvent[];
  render: (kind: InvitationKind) => { subject: string; text: string };
}

/** "Tuesday 1 December 2026" for a plain date (formatted in UTC so no zone shifts the day). */
export function longDate(date: string): string {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const parts = new Intl.DateTimeFormat('en-GB', { timeZone: 'UTC', weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' }).formatToParts(new Date(Date.UTC(y, m - 1, d)));
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  // Assembled, so no comma appears whatever the ICU version prefers.
  return `${part('weekday')} ${part('day')} ${part('month')} ${part('year')}`;
}

const times = (s: InviteSnapshot, from: Date, to: Date) => `${clockOf(from, s.timeZone)} to ${clockOf(to, s.timeZone)}`;

function heading(kind: InvitationKind): { prefix: string; opening: string } {
  switch (kind) {
    case 'invitation':
      return { prefix: '', opening: '' };
    case 'change':
      return { prefix: 'Changed: ', opening: 'The time has changed. ' };
    case 'cancellation':
      return { prefix: 'Cancelled: ', opening: '' };
  }
}

function candidateFacts(s: InviteSnapshot, slot: SnapshotSlot): Facts[] {
  return slot.recipients.map((to) => {
    const self = to.name === slot.candidateName;
    const event: IcsEvent = {
      uid: `slot-${slot.id}@stavemark`,
      sequence: s.revision,
      start: slot.startsAt,
      end: slot.endsAt,
      summary: `Mock exam: ${slot.candidateName} (${slot.listName})`,
      location: s.room,
      description: `${s.title} at ${s.organisationName}. Please arrive ten minutes early.`,
    };
    return {
      key: `candidate:${slot.id}:${to.address}`,
      to,
      fingerprint: JSON.stringify([slot.startsAt.getTime(), slot.endsAt.getTime(), s.room, s.title, slot.listName]),
      events: [event],
      render: (kind) => {
        const h = heading(kind);
        const who = self ? 'You have' : `${slot.candidateName} has`;
        const when = `${longDate(s.date)}, ${times(s, slot.startsAt, slot.endsAt)}`;
        const subject = `${h.prefix}Mock exam for ${slot.candidateName}: ${when}`;
        const body =
          kind === 'cancellation'
            ? `The mock exam slot for ${slot.candidateName} on ${when} (${s.title}, ${s.room}) has been cancelled. The attached calendar file removes it from your calendar.`
            : `${h.opening}${who} a mock exam (${slot.listName}) on ${when}, in ${s.room}. Please arrive ten minutes early so there is time to settle at the piano.\n\nThe attached calendar file adds it to your calendar. Times are in the ${s.timeZone} time zone.`;
        return { subject, text: `Hello ${to.name},\n\n${body}\n\nWith best wishes,\n${s.organisationName}\n` };
      },
    };
  });
}

function examinerFacts(s: InviteSnapshot, examiner: InviteSnapshot['examiners'][number]): Facts | null {
  const mine = s.slots.filter((x) => x.examinerId === examiner.id || x.secondExaminerId === examiner.id).sort((a, b) => a.startsAt.getTime() - b.startsAt.getTime());
  if (mine.length === 0) return null;
  const lines = mine.map(
    (x) => `${clockOf(x.startsAt, s.timeZone)}–${clockOf(x.endsAt, s.timeZone)}  ${x.candidateName} (${x.listName})${x.secondExaminerId === examiner.id ? ', second marking' : ''}`,
  );
  const first = mine[0]!;
  const last = mine[mine.length - 1]!;
  const event: IcsEvent = {
    uid: `sitting-${s.sittingId}-examiner-${examiner.id}@stavemark`,
    sequence: s.revision,
    start: first.startsAt,
    end: last.endsAt,
    summary: `Examining: ${s.title}`,
    location: s.room,
    description: lines.join('\n'),
  };
  return {
    key: `examiner:${examiner.id}`,
    to: examiner,
    fingerprint: JSON.stringify([s.room, s.title, lines]),
    events: [event],
    render: (kind) => {
      const h = heading(kind);
      const when = `${longDate(s.date)}, ${times(s, first.startsAt, last.endsAt)}`;
      const subject = `${h.prefix}Examining ${s.title}: ${when}`;
      const body =
        kind === 'cancellation'
          ? `You are no longer examining at ${s.title} on ${longDate(s.date)} (${s.room}). The attached calendar file removes it from your calendar.`
          : `${h.opening}You are examining at ${s.title} on ${when}, in ${s.room}. Your candidates:\n\n${lines.join('\n')}\n\nThe attached calendar file adds the session to your calendar. Times are in the ${s.timeZone} time zone.`;
      return { subject, text: `Hello ${examiner.name},\n\n${body}\n\nWith thanks,\n${s.organisationName}\n` };
    },
  };
}

function factsOf(s: InviteSnapshot | null): Map<string, Facts> {
  const out = new Map<string, Facts>();
  if (!s) return out;
  for (const slot of s.slots) for (const f of candidateFacts(s, slot)) out.set(f.key, f);
  for (const e of s.examiners) {
    const f = examinerFacts(s, e);
    if (f) out.set(f.key, f);
  }
  return out;
}

function outgoing(f: Facts, kind: InvitationKind, timeZone: string, stamp: Date, date: string): OutgoingInvitation {
  const { subject, text } = f.render(kind);
  const events = kind === 'cancellation' ? f.events.map((e) => ({ ...e, status: 'CANCELLED' as const })) : f.events;
  return { key: f.key, kind, to: f.to, subject, text, ics: buildIcs({ timeZone, stamp, events }), filename: `mock-exam-${date}.ics` };
}

/**
 * The messages a change calls for: an invitation to everyone new, a change notice to those whose
 * times or room changed, a cancellation to those no longer in it. `before` is null when the
 * sitting is being scheduled; `after` is null when it is being withdrawn.
 */
export function invitationsFor(before: InviteSnapshot | null, after: InviteSnapshot | null, stamp: Date): OutgoingInvitation[] {
  const was = factsOf(before);
  const now = factsOf(after);
  const out: OutgoingInvitation[] = [];
  for (const [key, f] of now) {
    const old = was.get(key);
    if (!old) out.push(outgoing(f, 'invitation', after!.timeZone, stamp, after!.date));
    else if (old.fingerprint !== f.fingerprint) out.push(outgoing(f, 'change', after!.timeZone, stamp, after!.date));
  }
  for (const [key, f] of was) {
    if (now.has(key)) continue;
    // A cancellation must carry a higher SEQUENCE than the invitation it cancels (RFC 5545 §3.8.7.4).
    const bumped = { ...f, events: f.events.map((e) => ({ ...e, sequence: (after?.revision ?? before!.revision + 1) })) };
    out.push(outgoing(bumped, 'cancellation', before!.timeZone, stamp, before!.date));
  }
  return out;
}

/** The calendar of a set of slots, one event per slot (the sitting's download). */
export function sittingCalendar(s: InviteSnapshot, stamp: Date): string {
  return buildIcs({
    timeZone: s.timeZone,
    stamp,
    events: s.slots.map((slot) => ({
      uid: `slot-${slot.id}@stavemark`,
      sequence: s.revision,
      start: slot.startsAt,
      end: slot.endsAt,
      summary: `Mock exam: ${slot.candidateName} (${slot.listName})`,
      location: s.room,
      description: `${s.title} at ${s.organisationName}.`,
    })),
  });
}
