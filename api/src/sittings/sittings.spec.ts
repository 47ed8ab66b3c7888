import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ICAL from 'ical.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planSlotMinutes, type RequirementListVersionView, type SittingView, type SlotView } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { startMailCatcher, type RunningMailCatcher } from '../mail-catcher/catcher.js';
import { listCaughtMail, waitForCaughtMail } from '../mail-catcher/mailbox.js';

// The whole Sittings feature against a real PostgreSQL and the demo school (seeded for
// 2026-12-01, Europe/London). Slot lengths are checked against the shared planSlotMinutes, which
// its own tests check against hand-worked slots; the clock-change dates follow the EU summer-time
// rule (Directive 2000/84/EC: the last Sundays of March and October, at 01:00 UTC).

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

/** The sender records the Message-ID just after the catcher stores the message. */
async function waitForSent(t: TestApp, messageId: string | null | undefined): Promise<void> {
  for (let i = 0; i < 50; i++) {
    const rows = (await t.db.query(`SELECT 1 FROM outbound_mail WHERE message_id = $1 AND kind LIKE 'sitting_%'`, [messageId])) as unknown[];
    if (rows.length) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no sitting mail row recorded message ${messageId}`);
}

describe('sittings', () => {
  let t: TestApp;
  let dir: string;
  let catcher: RunningMailCatcher;
  const tok: Record<string, string> = {};
  let g1: RequirementListVersionView;
  let g3: RequirementListVersionView;
  let g5: RequirementListVersionView;
  let classId: Record<string, string>;
  let examiner: Record<string, string>;
  let studentId: Record<string, string>;
  let a: SittingView; // the teacher's sitting for Wednesday Intermediates
  const http = () => t.http();

  const day = (date: string, over: object = {}) => ({
    title: 'Grade 3 mock',
    date,
    room: 'Studio 1',
    dayStart: '09:00',
    dayEnd: '12:00',
    breaks: [{ start: '10:30', end: '10:45', label: 'Coffee' }],
    writeUpGapMinutes: 3,
    changeoverMinutes: 0,
    papers: [{ listVersionId: g3.id }],
    examinerIds: [examiner.priya],
    ...over,
  });
  const create = (who: string, body: object) => http().post('/api/sittings').set(auth(tok[who]!)).send(body);
  const slotOf = (s: SittingView, name: string): SlotView => {
    const found = s.slots.find((x) => x.candidate.name === name);
    if (!found) throw new Error(`${name} has no slot in ${s.title}`);
    return found;
  };

  beforeAll(async () => {
    process.env.STAVEMARK_NOW = '2026-12-01T08:00:00Z';
    dir = await mkdtemp(join(tmpdir(), 'stavemark-sittings-mail-'));
    catcher = await startMailCatcher({ dir, port: 0 });
    t = await createTestApp({ env: { SMTP_PORT: String(catcher.port), MAIL_CATCHER_DIR: dir, MAIL_POLL_SECONDS: '0.5', STAVEMARK_NOW: '2026-12-01T08:00:00Z' } });
    for (const [k, email] of Object.entries({
      teacher: 'teacher@demo.example',
      admin: 'admin@demo.example',
      priya: 'examiner@demo.example',
      ottilie: 'ottilie.brandt@demo.example',
      beatrix: 'beatrix.oduya@demo.example',
      student: 'student@demo.example',
      fernhill: 'admin@fernhill.example',
    })) {
      tok[k] = await signIn(t, email);
    }
    const lists = (await http().get('/api/requirement-lists').set(auth(tok.teacher!))).body as { grade: string; published: { id: string } }[];
    const version = async (grade: string) => (await http().get(`/api/requirement-list-versions/${lists.find((l) => l.grade === grade)!.published.id}`).set(auth(tok.teacher!))).body as RequirementListVersionView;
    [g1, g3, g5] = [await version('1'), await version('3'), await version('5')];
    const classes = (await http().get('/api/classes').set(auth(tok.teacher!))).body as { id: string; code: string }[];
    classId = Object.fromEntries(classes.map((c) => [c.code, c.id]));
    const ex = (await http().get('/api/examiners').set(auth(tok.teacher!))).body as { id: string; email: string }[];
    examiner = {
      priya: ex.find((e) => e.email === 'examiner@demo.example')!.id,
      ottilie: ex.find((e) => e.email === 'ottilie.brandt@demo.example')!.id,
      beatrix: ex.find((e) => e.email === 'beatrix.oduya@demo.example')!.id,
    };
    const rows = (await t.db.query(`SELECT id, given_name || ' ' || family_name AS name FROM students`)) as { id: string; name: string }[];
    studentId = Object.fromEntries(rows.map((r) => [r.name, r.id]));
  });
  afterAll(async () => {
    await t?.close();
    await catcher?.close();
    await rm(dir, { recursive: true, force: true });
    delete process.env.STAVEMARK_NOW;
  });

  describe('the demo seed', () => {
    it('holds today’s scheduled sitting for examiner@demo.example, pinned, with a lengthened slot', async () => {
      const list = await http().get('/api/sittings?from=2026-12-01&to=2026-12-01').set(auth(tok.priya!));
      expect(list.status).toBe(200);
      expect(list.body).toHaveLength(1);
      const today = (await http().get(`/api/sittings/${list.body[0].id}`).set(auth(tok.priya!))).body as SittingView;
      expect(today).toMatchObject({ title: 'Grade 5 mock — Thursday Seniors', status: 'scheduled', dayStart: '09:30', room: 'Recital Room' });
      expect(today.slots.map((s) => s.startTime)[0]).toBe('09:30');
      expect(today.pinned?.bandPolicy.version).toBe(1);
      expect(today.permissions.changeStatus).toEqual(['in_progress']);
      // Wren Ashdown's 25 % extra time: planSlotMinutes with the arrangement, vs. everyone else's
      const wren = slotOf(today, 'Wren Ashdown');
      expect(wren.minutes).toBe(planSlotMinutes(g5, { writeUpGapMinutes: 3, extraTimePercent: 25 }));
      expect(slotOf(today, 'Ellis Northcott').minutes).toBe(planSlotMinutes(g5, { writeUpGapMinutes: 3 }));
      // the examiner does not see the arrangement before marking starts
      expect(wren.arrangement).toBeUndefined();
      // no slot touches the 10:00–10:15 break
      for (const s of today.slots) expect(s.endTime <= '10:00' || s.startTime >= '10:15').toBe(true);
    });
  });

  describe('planning a sitting for a class', () => {
    it('suggests each list’s slot length from planSlotMinutes plus the write-up gap', async () => {
      const res = await create('teacher', day('2026-12-08'));
      expect(res.status).toBe(201);
      a = res.body;
      expect(a).toMatchObject({ status: 'draft', dayStart: '09:00', dayEnd: '12:00', plannedBy: { displayName: 'Idris Calloway' }, pinned: null });
      expect(a.papers[0]).toMatchObject({ name: 'Grade 3 technique', suggestedMinutes: planSlotMinutes(g3, { writeUpGapMinutes: 3 }), slotMinutes: null });
    });

    it('adds a class: each candidate to the list of their grade, the others skipped with a reason', async () => {
      const res = await http().post(`/api/sittings/${a.id}/candidates`).set(auth(tok.teacher!)).send({ classId: classId['WED-INT'] });
      expect(res.status).toBe(200);
      expect(res.body.added).toBe(5);
      expect(res.body.skipped).toHaveLength(5);
      expect(res.body.skipped[0].reason).toBe('no grade 4 list in this sitting');
      a = res.body;
      const len = planSlotMinutes(g3, { writeUpGapMinutes: 3 });
      // 09:00 in London in December is 09:00 UTC; back to back with no changeover
      expect(a.slots[0]!.startsAt).toBe('2026-12-08T09:00:00.000Z');
      a.slots.forEach((s, i) => {
        expect(s.minutes).toBe(len);
        if (i > 0) expect(s.startsAt).toBe(a.slots[i - 1]!.endsAt);
      });
      expect(a.slots.map((s) => s.candidate.grade)).toEqual([3, 3, 3, 3, 3]);
    });

    it('a candidate on extra time and rest breaks gets a longer slot; the rest of the day moves on', async () => {
      const kaia = slotOf(a, 'Kaia Gorsedd');
      const put = await http()
        .put(`/api/students/${kaia.studentId}/access-arrangement`)
        .set(auth(tok.teacher!))
        .send({ extraTimePercent: 25, restBreakMinutes: 5, substitutions: [{ type: 'hands_separately', appliesTo: ['scale'] }], notes: 'Approved by the head of music.' });
      expect(put.status).toBe(200);
      expect(put.body).toMatchObject({ extraTimePercent: 25, restBreakMinutes: 5, updatedBy: { displayName: 'Idris Calloway' } });
      a = (await http().get(`/api/sittings/${a.id}`).set(auth(tok.teacher!))).body;
      const k = slotOf(a, 'Kaia Gorsedd');
      expect(k.minutes).toBe(planSlotMinutes(g3, { writeUpGapMinutes: 3, extraTimePercent: 25, substitutions: [{ type: 'hands_separately', appliesTo: ['scale'] }] }) + 5);
      expect(k.lengthened).toBe(true);
      expect(k.arrangement).toMatchObject({ extraTimePercent: 25, restBreakMinutes: 5 });
      const i = a.slots.indexOf(k);
      expect(a.slots[i + 1]!.startsAt).toBe(k.endsAt);
      // audited with before and after
      const audit = (await t.db.query(`SELECT after FROM audit_events WHERE action = 'access_arrangement.saved' AND entity_id = $1`, [k.studentId])) as { after: { extraTimePercent: number } }[];
      expect(audit[0]!.after.extraTimePercent).toBe(25);
    });

    it('moves a slot earlier or later and swaps two slots, keeping the day contiguous', async () => {
      const first = a.slots[0]!;
      const last = a.slots[4]!;
      const later = await http().post(`/api/slots/${first.id}/move`).set(auth(tok.teacher!)).send({ direction: 'later' });
      expect(later.status).toBe(200);
      expect(later.body.slots[1].id).toBe(first.id);
      expect(later.body.slots[0].startTime).toBe('09:00');
      const refused = await http().post(`/api/slots/${last.id}/move`).set(auth(tok.teacher!)).send({ direction: 'later' });
      expect(refused.status).toBe(409);
      expect(refused.body.message).toBe('This slot is already the last of the day.');
      const swap = await http().post(`/api/slots/${first.id}/swap`).set(auth(tok.teacher!)).send({ withSlotId: last.id });
      expect(swap.status).toBe(200);
      a = swap.body;
      expect(a.slots[1]!.id).toBe(last.id);
      expect(a.slots[4]!.id).toBe(first.id);
      expect(a.slots[0]!.startTime).toBe('09:00');
    });
  });

  describe('conflicts are refused with a clear message', () => {
    it('a room double-booked', async () => {
      const res = await create('teacher', day('2026-12-08', { room: '  studio 1 ', dayStart: '11:00', dayEnd: '13:00', breaks: [], title: 'Clash' }));
      expect(res.status).toBe(409);
      expect(res.body.details.kind).toBe('conflicts');
      expect(res.body.details.conflicts[0].kind).toBe('room');
      expect(res.body.message).toBe('Studio 1 is already booked from 09:00 to 12:00 for "Grade 3 mock" (Studio 1, 2026-12-08).');
    });

    it('a candidate in two places at once', async () => {
      const b = await create('teacher', day('2026-12-08', { room: 'Studio 3', title: 'Second room', examinerIds: [examiner.ottilie] }));
      expect(b.status).toBe(201);
      // the first candidate of the Studio 1 day is at 09:00 there, and would be at 09:00 here
      const first = a.slots[0]!;
      const res = await http().post(`/api/sittings/${b.body.id}/candidates`).set(auth(tok.teacher!)).send({ studentIds: [first.studentId] });
      expect(res.status).toBe(409);
      expect(res.body.details.conflicts[0].kind).toBe('candidate');
      expect(res.body.message).toBe(`${first.candidate.name} is already a candidate in "Grade 3 mock" (Studio 1, 2026-12-08) from 09:00 to ${first.endTime}; here the slot would be 09:00–${first.endTime}.`);
      // nothing was added
      expect((await http().get(`/api/sittings/${b.body.id}`).set(auth(tok.teacher!))).body.slots).toEqual([]);
    });

    it('an examiner in two places at once', async () => {
      const b = await create('teacher', day('2026-12-08', { room: 'Studio 4', title: 'Grade 1 mock', papers: [{ listVersionId: g1.id }] }));
      expect(b.status).toBe(201);
      const res = await http().post(`/api/sittings/${b.body.id}/candidates`).set(auth(tok.teacher!)).send({ studentIds: [studentId['Ada Pendry']] });
      expect(res.status).toBe(409);
      expect(res.body.details.conflicts.map((c: { kind: string }) => c.kind)).toEqual(['examiner']);
      expect(res.body.message).toMatch(/^Priya Halvorsen is examining in "Grade 3 mock" \(Studio 1, 2026-12-08\) from 09:00 to \d\d:\d\d, so cannot also mark Ada Pendry here at 09:00–\d\d:\d\d\.$/);
    });

    it('a slot past the end of the day (nothing is added)', async () => {
      const c = await create('teacher', day('2026-12-09', { dayEnd: '09:30', breaks: [], title: 'Short day' }));
      expect(c.status).toBe(201);
      const res = await http().post(`/api/sittings/${c.body.id}/candidates`).set(auth(tok.teacher!)).send({ classId: classId['WED-INT'] });
      expect(res.status).toBe(409);
      expect(res.body.details.conflicts.every((x: { kind: string }) => x.kind === 'past_day_end')).toBe(true);
      expect(res.body.message).toMatch(/past the end of the day at 09:30\. \(and \d+ more\)$/);
      expect((await http().get(`/api/sittings/${c.body.id}`).set(auth(tok.teacher!))).body.slots).toEqual([]);
      // shortening a planned day that no longer fits is refused too
      const shorten = await http().patch(`/api/sittings/${a.id}`).set(auth(tok.teacher!)).send({ dayEnd: '09:40', breaks: [] });
      expect(shorten.status).toBe(409);
      expect(shorten.body.details.conflicts[0].kind).toBe('past_day_end');
      expect((await http().delete(`/api/sittings/${c.body.id}`).set(auth(tok.teacher!))).status).toBe(204);
    });

    it('a chosen start inside a break', async () => {
      const slot = a.slots[4]!;
      const res = await http().patch(`/api/slots/${slot.id}`).set(auth(tok.teacher!)).send({ notBefore: '10:35' });
      expect(res.status).toBe(409);
      expect(res.body.details.conflicts[0].kind).toBe('inside_break');
      expect(res.body.message).toContain('would fall in the break 10:30–10:45 (Coffee): choose another start time.');
      // a chosen start after the break is fine and leaves a gap
      const ok = await http().patch(`/api/slots/${slot.id}`).set(auth(tok.teacher!)).send({ notBefore: '11:00' });
      expect(ok.status).toBe(200);
      expect(ok.body.slots[4]).toMatchObject({ startTime: '11:00', notBefore: '11:00' });
      a = ok.body;
    });

    it('an examiner marking their own pupil: a warning that must be acknowledged, and is recorded', async () => {
      const d = await create('teacher', day('2026-12-10', { title: 'Beatrix’s panel', examinerIds: [examiner.beatrix] }));
      expect(d.status).toBe(201);
      const warn = await http().post(`/api/sittings/${d.body.id}/candidates`).set(auth(tok.teacher!)).send({ classId: classId['WED-INT'] });
      expect(warn.status).toBe(409);
      expect(warn.body.details.kind).toBe('own_pupil');
      expect(warn.body.details.warnings).toHaveLength(5);
      expect(warn.body.message).toMatch(/^Beatrix Oduya teaches [A-Z][a-z]+ [A-Z][a-z]+ \(Wednesday Intermediates\) and would mark their slot\. \(and 4 more\) Go ahead only if/);
      const ok = await http().post(`/api/sittings/${d.body.id}/candidates`).set(auth(tok.teacher!)).send({ classId: classId['WED-INT'], acknowledgeOwnPupil: true });
      expect(ok.status).toBe(200);
      expect(ok.body.slots.every((s: SlotView) => s.ownPupilAcknowledged?.by === 'Idris Calloway')).toBe(true);
      const audit = (await t.db.query(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'slot.own_pupil_acknowledged'`)) as { n: number }[];
      expect(audit[0]!.n).toBe(5);
    });

    it('refuses a day across the clocks changing, and a time the clocks skip', async () => {
      const across = await create('teacher', day('2027-03-28', { dayStart: '00:30', dayEnd: '03:00', breaks: [] }));
      expect(across.status).toBe(400);
      expect(across.body.message).toMatch(/^dayStart: 01:30 does not exist|The clocks change in Europe\/London/);
    });
  });

  describe('double marking', () => {
    it('gives a share of the slots a second examiner, avoiding one who teaches the candidate', async () => {
      const panel = await http().patch(`/api/sittings/${a.id}`).set(auth(tok.teacher!)).send({ examinerIds: [examiner.priya, examiner.ottilie, examiner.beatrix] });
      expect(panel.status).toBe(200);
      const res = await http().post(`/api/sittings/${a.id}/double-marking`).set(auth(tok.teacher!)).send({ share: 40 });
      expect(res.status).toBe(200);
      // 40 % of 5 = 2 slots, spread: the 2nd and the 4th (positions 1 and 3)
      const doubled = res.body.slots.filter((s: SlotView) => s.secondExaminer);
      expect(doubled.map((s: SlotView) => s.position)).toEqual([1, 3]);
      // Beatrix teaches every candidate here: Ottilie takes both
      expect(doubled.map((s: SlotView) => s.secondExaminer!.displayName)).toEqual(['Ottilie Brandt', 'Ottilie Brandt']);
      const chosen = await http().post(`/api/sittings/${a.id}/double-marking`).set(auth(tok.teacher!)).send({ slotIds: [res.body.slots[0].id] });
      expect(chosen.body.slots.filter((s: SlotView) => s.secondExaminer).map((s: SlotView) => s.position)).toEqual([0]);
      const back = await http().patch(`/api/sittings/${a.id}`).set(auth(tok.teacher!)).send({ examinerIds: [examiner.priya, examiner.ottilie] });
      a = back.body;
      expect(a.slots.filter((s) => s.secondExaminer)).toHaveLength(1);
    });
  });

  describe('scheduling pins versions and sends invitations', () => {
    it('refuses to skip a step', async () => {
      const res = await http().post(`/api/sittings/${a.id}/status`).set(auth(tok.teacher!)).send({ status: 'in_progress' });
      expect(res.status).toBe(409);
      expect(res.body.message).toBe('A draft sitting moves next to scheduled, not in progress.');
    });

    it('an examiner cannot see a draft, even on its panel', async () => {
      expect((await http().get(`/api/sittings/${a.id}`).set(auth(tok.priya!))).status).toBe(404);
    });

    it('schedules: pins the list version, its rubric versions and the band policy; e-mails examiners and guardians with a calendar file', async () => {
      const res = await http().post(`/api/sittings/${a.id}/status`).set(auth(tok.teacher!)).send({ status: 'scheduled' });
      expect(res.status).toBe(200);
      a = res.body;
      expect(a.status).toBe('scheduled');
      expect(a.pinned).toMatchObject({ listVersionIds: [g3.id], bandPolicy: { version: 1 } });
      expect(a.pinned!.rubricVersionIds).toEqual([...new Set(g3.lines.map((l) => l.rubricVersionId))].sort());
      expect((await http().get(`/api/requirement-list-versions/${g3.id}`).set(auth(tok.teacher!))).body.usedAt).not.toBeNull();

      const mails = (await t.db.query(`SELECT kind, to_address FROM outbound_mail WHERE sitting_id = $1 ORDER BY to_address`, [a.id])) as { kind: string; to_address: string }[];
      // the two examiners who mark, and one guardian per (minor) candidate
      const guardians = (await t.db.query(`SELECT g.email FROM guardians g WHERE g.student_id = ANY($1)`, [a.slots.map((s) => s.studentId)])) as { email: string }[];
      expect(mails.map((m) => m.to_address).sort()).toEqual(['examiner@demo.example', 'ottilie.brandt@demo.example', ...guardians.map((g) => g.email)].sort());
      expect(new Set(mails.map((m) => m.kind))).toEqual(new Set(['sitting_invitation']));

      const mail = await waitForCaughtMail(dir, (m) => m.to.some((x) => x.includes('examiner@demo.example')));
      expect(mail.subject).toBe(`Examining Grade 3 mock: Tuesday 8 December 2026, 09:00 to ${a.slots.at(-1)!.endTime}`);
      expect(mail.text).toContain('Kaia Gorsedd (Grade 3 technique)');
      expect(mail.text).not.toMatch(/extra time|Approved by/i); // the arrangement stays confidential
      const ics = Buffer.from(mail.attachments.find((x) => x.filename?.endsWith('.ics'))!.contentBase64, 'base64').toString('utf8');
      const ev = new ICAL.Event(new ICAL.Component(ICAL.parse(ics)).getFirstSubcomponent('vevent')!);
      expect(ev.startDate.toJSDate().toISOString()).toBe('2026-12-08T09:00:00.000Z');
      expect(ev.summary).toBe('Examining: Grade 3 mock');

      // The admin's Outbox lists the invitation the catcher received, with its kind.
      await waitForSent(t, mail.messageId);
      const outbox = await http().get('/api/dev/outbox').set(auth(tok.admin!));
      expect(outbox.status).toBe(200);
      const item = (outbox.body.items as { id: string; kind: string }[]).find((i) => i.id === mail.id);
      expect(item?.kind).toBe('sitting_invitation');
    });

    it('later edits to the list and the band policy never change the sitting', async () => {
      const body = {
        name: g3.name,
        grade: g3.grade,
        totalMarks: g3.totalMarks,
        selectionRule: g3.selectionRule,
        lines: g3.lines.map(({ rubric: _r, id: _i, ...l }) => ({ ...l, tempo: { ...l.tempo, bpm: l.tempo.bpm + 8 } })),
      };
      const edit = await http().put(`/api/requirement-list-versions/${g3.id}`).set(auth(tok.teacher!)).send(body);
      expect(edit.status).toBe(409);
      const v2 = await http().post(`/api/requirement-lists/${g3.listId}/versions`).set(auth(tok.teacher!)).send(body);
      expect(v2.status).toBe(201);
      expect((await http().post(`/api/requirement-list-versions/${v2.body.id}/publish`).set(auth(tok.teacher!))).status).toBe(200);
      const policy = await http()
        .post('/api/band-policy')
        .set(auth(tok.admin!))
        .send({ bands: [{ key: 'distinction', label: 'Distinction', minPercent: 85 }, { key: 'pass', label: 'Pass', minPercent: 60 }], below: { key: 'not_yet', label: 'Not yet' } });
      expect(policy.status).toBe(201);
      expect(policy.body.current.version).toBe(2);
      const after = (await http().get(`/api/sittings/${a.id}`).set(auth(tok.teacher!))).body as SittingView;
      expect(after.pinned).toEqual(a.pinned);
      expect(after.papers[0]).toMatchObject({ listVersionId: g3.id, version: 1 });
      expect(after.slots.map((s) => s.minutes)).toEqual(a.slots.map((s) => s.minutes));
      const lists = await http().patch(`/api/sittings/${a.id}`).set(auth(tok.teacher!)).send({ papers: [{ listVersionId: v2.body.id }] });
      expect(lists.status).toBe(409);
      expect(lists.body.message).toMatch(/^This sitting is scheduled: its requirement lists and write-up gap are pinned/);
    });

    it('a moved slot sends change notices only to those whose times changed', async () => {
      await t.db.query(`DELETE FROM outbound_mail WHERE kind LIKE 'sitting_%'`);
      const [x, y] = [a.slots[2]!, a.slots[3]!];
      const res = await http().post(`/api/slots/${y.id}/move`).set(auth(tok.teacher!)).send({ direction: 'earlier' });
      expect(res.status).toBe(200);
      const mails = (await t.db.query(
        `SELECT kind, to_name, data->>'subject' AS subject, data->>'ics' AS ics FROM outbound_mail WHERE kind LIKE 'sitting_%'`,
      )) as { kind: string; to_name: string; subject: string; ics: string }[];
      const guardianOf = async (sid: string) => ((await t.db.query(`SELECT name FROM guardians WHERE student_id = $1`, [sid])) as { name: string }[]).map((g) => g.name);
      const expected = [...(await guardianOf(x.studentId)), ...(await guardianOf(y.studentId)), 'Priya Halvorsen'];
      // Ottilie second-marks the first slot only, which did not move: she hears nothing
      expect(a.slots.filter((s) => s.secondExaminer).map((s) => s.position)).toEqual([0]);
      expect(mails.map((m) => m.to_name).sort()).toEqual(expected.sort());
      expect(mails.every((m) => m.kind === 'sitting_change')).toBe(true);
      expect(mails[0]!.subject).toMatch(/^Changed: /);
      expect(mails[0]!.ics).toContain(`SEQUENCE:${2}`);
      a = res.body;
    });
  });

  describe('the clock-change day keeps its local times', () => {
    it('09:00 on 28 March 2027 (clocks go forward) is 08:00 UTC; the day before, 09:00 UTC; the calendar agrees', async () => {
      const before = await create('teacher', day('2027-03-27', { room: 'Studio 5', title: 'Saturday before', papers: [{ listVersionId: g1.id }], examinerIds: [examiner.ottilie] }));
      const on = await create('teacher', day('2027-03-28', { room: 'Studio 5', title: 'Clock-change Sunday', papers: [{ listVersionId: g1.id }], examinerIds: [examiner.ottilie] }));
      for (const s of [before, on]) {
        expect(s.status).toBe(201);
        const add = await http().post(`/api/sittings/${s.body.id}/candidates`).set(auth(tok.teacher!)).send({ studentIds: [studentId['Ada Pendry'], studentId['Cleo Castellan']] });
        expect(add.status).toBe(200);
        expect(add.body.slots[0].startTime).toBe('09:00');
        expect(add.body.slots[1].startTime).toBe(add.body.slots[0].endTime);
      }
      const sat = (await http().get(`/api/sittings/${before.body.id}`).set(auth(tok.teacher!))).body as SittingView;
      const sun = (await http().get(`/api/sittings/${on.body.id}`).set(auth(tok.teacher!))).body as SittingView;
      expect(sat.slots[0]!.startsAt).toBe('2027-03-27T09:00:00.000Z');
      expect(sun.slots[0]!.startsAt).toBe('2027-03-28T08:00:00.000Z');
      expect(sun.slots.map((s) => s.startTime)).toEqual(sat.slots.map((s) => s.startTime));
      const cal = await http().get(`/api/sittings/${on.body.id}/calendar`).set(auth(tok.teacher!)).buffer(true).parse((res, cb) => {
        let text = '';
        res.on('data', (c: Buffer) => (text += c.toString('utf8')));
        res.on('end', () => cb(null, text));
      });
      expect(cal.status).toBe(200);
      expect(cal.headers['content-type']).toMatch(/^text\/calendar/);
      expect(cal.headers['content-disposition']).toBe('attachment; filename="2027-03-28-clock-change-sunday.ics"');
      const text = cal.body as string;
      expect(text.replace(/\r\n /g, '')).toContain('DTSTART;TZID=Europe/London:20270328T090000');
      const events = new ICAL.Component(ICAL.parse(text)).getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
      expect(events.map((e) => e.startDate.toJSDate().toISOString())).toEqual(sun.slots.map((s) => s.startsAt));
    });
  });

  describe('who sees what', () => {
    let today: SittingView;
    beforeAll(async () => {
      const list = await http().get('/api/sittings?from=2026-12-01&to=2026-12-01').set(auth(tok.teacher!));
      today = (await http().get(`/api/sittings/${list.body[0].id}`).set(auth(tok.teacher!))).body;
    });

    it('another organisation’s sitting and an examiner’s unassigned one answer 404', async () => {
      expect((await http().get(`/api/sittings/${a.id}`).set(auth(tok.fernhill!))).status).toBe(404);
      const beatrixOnly = await create('teacher', day('2026-12-11', { room: 'Studio 6', title: 'Not Priya’s', papers: [{ listVersionId: g1.id }], examinerIds: [examiner.ottilie] }));
      await http().post(`/api/sittings/${beatrixOnly.body.id}/candidates`).set(auth(tok.teacher!)).send({ studentIds: [studentId['Ada Pendry']] });
      expect((await http().post(`/api/sittings/${beatrixOnly.body.id}/status`).set(auth(tok.teacher!)).send({ status: 'scheduled' })).status).toBe(200);
      expect((await http().get(`/api/sittings/${beatrixOnly.body.id}`).set(auth(tok.priya!))).status).toBe(404);
      expect((await http().get(`/api/sittings/${beatrixOnly.body.id}/calendar`).set(auth(tok.priya!))).status).toBe(404);
      expect((await http().post(`/api/slots/${today.slots[0]!.id}/move`).set(auth(tok.fernhill!)).send({ direction: 'later' })).status).toBe(404);
      const ids = ((await http().get('/api/sittings').set(auth(tok.priya!))).body as { id: string }[]).map((s) => s.id);
      expect(ids).toContain(a.id);
      expect(ids).not.toContain(beatrixOnly.body.id);
    });

    it('a student sees their own slot time and nothing else: no other candidates, examiners, lists or arrangements', async () => {
      const list = await http().get('/api/sittings').set(auth(tok.student!));
      expect(list.status).toBe(200);
      // Today's sitting first, then the past year's (the demo year of marks), each with only her slot.
      expect(list.body[0].id).toBe(today.id);
      expect(list.body.length).toBeGreaterThan(1);
      for (const s of list.body) expect(s).toMatchObject({ examiners: [], plannedBy: null, mySlot: expect.any(Object) });
      expect(list.body[0]).toMatchObject({ examiners: [], plannedBy: null, mySlot: { startTime: '09:30' } });
      const view = (await http().get(`/api/sittings/${today.id}`).set(auth(tok.student!))).body as SittingView;
      expect(view.slots).toHaveLength(1);
      expect(view.slots[0]).toMatchObject({ candidate: { name: 'Ellis Northcott' }, examiner: null, secondExaminer: null, startTime: '09:30' });
      expect(view.slots[0]).not.toHaveProperty('arrangement');
      expect(view.papers).toEqual([]);
      expect(view.pinned).toBeNull();
      expect((await http().get(`/api/sittings/${a.id}`).set(auth(tok.student!))).status).toBe(404);
      expect((await http().get(`/api/students/${studentId['Wren Ashdown']}/access-arrangement`).set(auth(tok.student!))).status).toBe(403);
      const ics = await http().get(`/api/sittings/${today.id}/calendar`).set(auth(tok.student!));
      expect(((ics.text ?? '').match(/BEGIN:VEVENT/g) ?? []).length).toBe(1);
    });

    it('arrangements: the candidate’s teachers and admins; an examiner only while marking', async () => {
      const wren = studentId['Wren Ashdown']!;
      expect((await http().get(`/api/students/${wren}/access-arrangement`).set(auth(tok.teacher!))).body.extraTimePercent).toBe(25);
      expect((await http().get(`/api/students/${wren}/access-arrangement`).set(auth(tok.admin!))).status).toBe(200);
      expect((await http().get(`/api/students/${wren}/access-arrangement`).set(auth(tok.priya!))).status).toBe(404);
      // Priya starts today's sitting on its day
      const start = await http().post(`/api/sittings/${today.id}/status`).set(auth(tok.priya!)).send({ status: 'in_progress' });
      expect(start.status).toBe(200);
      expect(slotOf(start.body, 'Wren Ashdown').arrangement).toMatchObject({ extraTimePercent: 25 });
      expect((await http().get(`/api/students/${wren}/access-arrangement`).set(auth(tok.priya!))).body.extraTimePercent).toBe(25);
      // Ottilie second-marks only some slots: she sees those slots, and only their arrangements
      const hers = (await http().get(`/api/sittings/${today.id}`).set(auth(tok.ottilie!))).body as SittingView;
      expect(hers.slots.length).toBeLessThan(today.slots.length);
      expect(hers.slots.every((s) => s.secondExaminer?.displayName === 'Ottilie Brandt')).toBe(true);
      // a teacher of another class cannot set an arrangement for a pupil who is not theirs
      expect((await http().put(`/api/students/${studentId['Elodie Merrow']}/access-arrangement`).set(auth(tok.teacher!)).send({ extraTimePercent: 10, restBreakMinutes: 0, substitutions: [] })).status).toBe(404);
    });

    it('the day schedule per room and per examiner; an examiner sees only their own column', async () => {
      const all = await http().get('/api/day-schedule?date=2026-12-08').set(auth(tok.teacher!));
      expect(all.status).toBe(200);
      // the other rooms that day have sittings without candidates (their conflicts were refused)
      expect(all.body.rooms.map((r: { room: string }) => r.room)).toEqual(['Studio 1']);
      expect(all.body.rooms[0].entries.map((e: { candidate: string }) => e.candidate)).toEqual(a.slots.map((s) => s.candidate.name));
      expect(all.body.examiners.map((e: { examiner: { displayName: string } }) => e.examiner.displayName)).toEqual(['Ottilie Brandt', 'Priya Halvorsen']);
      const mine = await http().get('/api/day-schedule?date=2026-12-08').set(auth(tok.priya!));
      expect(mine.body.examiners.map((e: { examiner: { displayName: string } }) => e.examiner.displayName)).toEqual(['Priya Halvorsen']);
      expect((await http().get('/api/day-schedule?date=2026-12-08').set(auth(tok.student!))).status).toBe(403);
      expect((await http().get('/api/day-schedule?date=8-12-2026').set(auth(tok.teacher!))).status).toBe(400);
    });
  });

  describe('outcomes and re-sits', () => {
    let today: SittingView;
    beforeAll(async () => {
      const list = await http().get('/api/sittings?from=2026-12-01&to=2026-12-01').set(auth(tok.teacher!));
      today = (await http().get(`/api/sittings/${list.body[0].id}`).set(auth(tok.teacher!))).body;
    });

    it('before a slot starts only a withdrawal can be recorded', async () => {
      const ellis = slotOf(today, 'Ellis Northcott');
      const res = await http().post(`/api/slots/${ellis.id}/outcome`).set(auth(tok.priya!)).send({ outcome: 'completed' });
      expect(res.status).toBe(409);
      expect(res.body.message).toBe("Ellis Northcott's slot starts at 09:30 on 2026-12-01; only a withdrawal can be recorded before then.");
    });

    it('the examiner records outcomes; marking cannot close while a slot has none', async () => {
      process.env.STAVEMARK_NOW = '2026-12-01T12:30:00Z';
      const ok = await http().post(`/api/slots/${slotOf(today, 'Ellis Northcott').id}/outcome`).set(auth(tok.priya!)).send({ outcome: 'completed' });
      expect(ok.status).toBe(200);
      expect(slotOf(ok.body, 'Ellis Northcott')).toMatchObject({ outcome: 'completed' });
      const absent = await http().post(`/api/slots/${slotOf(today, 'Yara Ambrose').id}/outcome`).set(auth(tok.teacher!)).send({ outcome: 'absent', note: 'Unwell; her father phoned.' });
      expect(absent.status).toBe(200);
      const close = await http().post(`/api/sittings/${today.id}/status`).set(auth(tok.teacher!)).send({ status: 'marking_closed' });
      expect(close.status).toBe(409);
      expect(close.body.message).toMatch(/^3 slot\(s\) have no outcome yet \(first: [A-Z]/);
      // an examiner cannot close marking
      expect((await http().post(`/api/sittings/${today.id}/status`).set(auth(tok.priya!)).send({ status: 'marking_closed' })).status).toBe(403);
      const audit = (await t.db.query(`SELECT before, after FROM audit_events WHERE action = 'slot.outcome_recorded' ORDER BY at`)) as { after: { outcome: string } }[];
      expect(audit.map((x) => x.after.outcome)).toEqual(['completed', 'absent']);
    });

    it('a re-sit is a new slot linked to the attempt it repeats, in a sitting with the same list', async () => {
      const yara = slotOf(today, 'Yara Ambrose');
      const e = await create('teacher', day('2026-12-15', { room: 'Recital Room', title: 'Grade 5 re-sits', papers: [{ listVersionId: g5.id }], examinerIds: [examiner.priya] }));
      expect(e.status).toBe(201);
      const res = await http().post(`/api/slots/${yara.id}/resit`).set(auth(tok.teacher!)).send({ sittingId: e.body.id });
      expect(res.status).toBe(201);
      expect(res.body.slots).toHaveLength(1);
      expect(res.body.slots[0]).toMatchObject({ candidate: { name: 'Yara Ambrose' }, resitOfSlotId: yara.id, startTime: '09:00' });
      const twice = await http().post(`/api/slots/${yara.id}/resit`).set(auth(tok.teacher!)).send({ sittingId: e.body.id });
      expect(twice.status).toBe(409);
      expect(twice.body.message).toBe('This attempt already has a re-sit.');
      const wrongList = await http().post(`/api/slots/${slotOf(today, 'Ellis Northcott').id}/resit`).set(auth(tok.teacher!)).send({ sittingId: a.id });
      expect(wrongList.status).toBe(409);
      expect(wrongList.body.message).toBe('The sitting for the re-sit has no Grade 5 technique list: add one, or choose another sitting.');
      const noOutcome = await http().post(`/api/slots/${slotOf(today, 'Wren Ashdown').id}/resit`).set(auth(tok.teacher!)).send({ sittingId: e.body.id });
      expect(noOutcome.status).toBe(409);
    });

    it('closes marking once every slot has an outcome, then publishes; published outcomes are final', async () => {
      for (const name of ['Wren Ashdown', 'Anouk Wetherby', 'Cosima Rooksby']) {
        expect((await http().post(`/api/slots/${slotOf(today, name).id}/outcome`).set(auth(tok.priya!)).send({ outcome: 'completed' })).status).toBe(200);
      }
      const close = await http().post(`/api/sittings/${today.id}/status`).set(auth(tok.teacher!)).send({ status: 'marking_closed' });
      expect(close.status).toBe(200);
      expect((await http().post(`/api/sittings/${today.id}/status`).set(auth(tok.teacher!)).send({ status: 'published' })).status).toBe(200);
      const late = await http().post(`/api/slots/${slotOf(today, 'Ellis Northcott').id}/outcome`).set(auth(tok.teacher!)).send({ outcome: 'incomplete' });
      expect(late.status).toBe(409);
      const again = await http().post(`/api/sittings/${today.id}/status`).set(auth(tok.teacher!)).send({ status: 'published' });
      expect(again.body.message).toBe('This sitting is published; its status is final.');
      process.env.STAVEMARK_NOW = '2026-12-01T08:00:00Z';
    });
  });

  it('bad input gets a clear error naming the field, and loses nothing', async () => {
    const res = await create('teacher', day('2026-12-20', { dayStart: '9:70', examinerIds: ['nope'] }));
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['dayStart', 'examinerIds.0']));
    const unknown = await create('teacher', { ...day('2026-12-20'), colour: 'blue' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.message).toMatch(/Unknown field\(s\): colour/);
    const notExaminer = await create('teacher', day('2026-12-20', { examinerIds: [(await http().get('/api/auth/me').set(auth(tok.teacher!))).body.memberships[0].membershipId ?? '00000000-0000-4000-8000-000000000000'] }));
    expect(notExaminer.status).toBe(400);
    expect(notExaminer.body.message).toBe('examinerIds.0: Choose an active member with the examiner role.');
    const draftList = await create('teacher', day('2026-12-20', { papers: [{ listVersionId: g3.id, slotMinutes: 3 }] }));
    expect(draftList.status).toBe(400);
    expect(draftList.body.message).toBe('papers.0.slotMinutes: A slot must be longer than the 3-minute write-up gap it includes.');
    expect((await http().post('/api/sittings').set(auth(tok.priya!)).send(day('2026-12-20'))).status).toBe(403);
    const mails = await listCaughtMail(dir);
    expect(mails.length).toBeGreaterThan(0);
  });
});
