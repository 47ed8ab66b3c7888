import { waitForCaughtMail } from '../src/mail-catcher/mailbox';
import { api, tokenFor } from './e2e-support/api';

// A teacher plans and schedules a sitting over HTTP against the running server; the invitations
// arrive at the test mail catcher with an RFC 5545 calendar file. 2 June 2031 is in British Summer
// Time, so 09:00 in London is 08:00 UTC (EU summer-time rule, Directive 2000/84/EC).
const MAIL_DIR = process.env.MAIL_CATCHER_DIR;
const run = Date.now().toString(36);
const auth = (t: string) => ({ Authorization: `Bearer ${t}` });

describe('sittings over HTTP', () => {
  let teacher: string;
  let priya: string;
  let student: string;
  let g3: string;
  let examiners: { id: string; email: string }[];
  let wedInt: string;
  let sittingId: string;
  const room = `E2E room ${run}`;
  const body = (over: object = {}) => ({
    title: `E2E Grade 3 mock ${run}`,
    date: '2031-06-02',
    room,
    dayStart: '09:00',
    dayEnd: '12:00',
    breaks: [{ start: '10:30', end: '10:45', label: 'Coffee' }],
    papers: [{ listVersionId: g3 }],
    examinerIds: [examiners.find((e) => e.email === 'examiner@demo.example')!.id, examiners.find((e) => e.email === 'ottilie.brandt@demo.example')!.id],
    ...over,
  });

  beforeAll(async () => {
    if (!MAIL_DIR) throw new Error('MAIL_CATCHER_DIR is not set: run this through `npm test -- e2e`');
    teacher = await tokenFor('teacher@demo.example');
    priya = await tokenFor('examiner@demo.example');
    student = await tokenFor('student@demo.example');
    const lists = (await api().get('/api/requirement-lists').set(auth(teacher))).body as { starterKey: string; published: { id: string } }[];
    g3 = lists.find((l) => l.starterKey === 'grade-3')!.published.id;
    examiners = (await api().get('/api/examiners').set(auth(teacher))).body;
    const classes = (await api().get('/api/classes').set(auth(teacher))).body as { id: string; code: string }[];
    wedInt = classes.find((c) => c.code === 'WED-INT')!.id;
  });

  it('plans a sitting for a class: grade 3 candidates in, grade 4 skipped with a reason', async () => {
    const created = await api().post('/api/sittings').set(auth(teacher)).send(body());
    expect(created.status).toBe(201);
    sittingId = created.body.id;
    const added = await api().post(`/api/sittings/${sittingId}/candidates`).set(auth(teacher)).send({ classId: wedInt });
    expect(added.status).toBe(200);
    expect(added.body.added).toBe(5);
    expect(added.body.skipped.map((s: { reason: string }) => s.reason)).toEqual(Array(5).fill('no grade 4 list in this sitting'));
    expect(added.body.slots[0]).toMatchObject({ startTime: '09:00', startsAt: '2031-06-02T08:00:00.000Z' });
  });

  it('extra time lengthens one slot; the others keep the list’s length', async () => {
    const view = (await api().get(`/api/sittings/${sittingId}`).set(auth(teacher))).body;
    const kaia = view.slots.find((s: { candidate: { name: string } }) => s.candidate.name === 'Kaia Gorsedd');
    const put = await api().put(`/api/students/${kaia.studentId}/access-arrangement`).set(auth(teacher)).send({ extraTimePercent: 50, restBreakMinutes: 0, substitutions: [] });
    expect(put.status).toBe(200);
    const after = (await api().get(`/api/sittings/${sittingId}`).set(auth(teacher))).body;
    const k = after.slots.find((s: { id: string }) => s.id === kaia.id);
    expect(k.lengthened).toBe(true);
    expect(k.minutes).toBeGreaterThan(after.papers[0].effectiveMinutes);
    for (const s of after.slots.filter((x: { id: string }) => x.id !== kaia.id)) expect(s.minutes).toBe(after.papers[0].effectiveMinutes);
  });

  it('refuses a second sitting in the same room at the same time, saying which', async () => {
    const res = await api().post('/api/sittings').set(auth(teacher)).send(body({ title: 'Clash', dayStart: '11:00', dayEnd: '13:00', breaks: [] }));
    expect(res.status).toBe(409);
    expect(res.body.message).toBe(`${room} is already booked from 09:00 to 12:00 for "E2E Grade 3 mock ${run}" (${room}, 2031-06-02).`);
  });

  it('scheduling e-mails the examiners and the guardians a calendar file with the local times', async () => {
    const res = await api().post(`/api/sittings/${sittingId}/status`).set(auth(teacher)).send({ status: 'scheduled' });
    expect(res.status).toBe(200);
    expect(res.body.pinned.listVersionIds).toEqual([g3]);
    const mail = await waitForCaughtMail(MAIL_DIR!, (m) => m.envelope.to.includes('examiner@demo.example') && m.subject.startsWith(`Examining E2E Grade 3 mock ${run}`), { timeoutMs: 20_000 });
    const att = mail.attachments.find((a) => a.filename?.endsWith('.ics'));
    expect(att?.contentType).toMatch(/^text\/calendar/);
    const ics = Buffer.from(att!.contentBase64, 'base64').toString('utf8');
    expect(ics.startsWith('BEGIN:VCALENDAR\r\nVERSION:2.0\r\nPRODID:')).toBe(true);
    expect(ics).toContain('DTSTART;TZID=Europe/London:20310602T090000');
    expect(ics).toContain('BEGIN:VTIMEZONE\r\nTZID:Europe/London');
    const guardian = await waitForCaughtMail(MAIL_DIR!, (m) => m.text.includes('Kaia Gorsedd has a mock exam') && m.text.includes(room), { timeoutMs: 20_000 });
    expect(guardian.subject).toMatch(/^Mock exam for Kaia Gorsedd: Monday 2 June 2031, \d\d:\d\d to \d\d:\d\d$/);
    expect(guardian.text).not.toMatch(/extra time/i);
  });

  it('the examiner sees it and downloads her calendar; the demo student (not a candidate) does not', async () => {
    const cal = await api().get(`/api/sittings/${sittingId}/calendar`).set(auth(priya));
    expect(cal.status).toBe(200);
    expect(cal.headers['content-type']).toMatch(/^text\/calendar/);
    expect(cal.text.match(/BEGIN:VEVENT/g)).toHaveLength(5);
    expect((await api().get(`/api/sittings/${sittingId}`).set(auth(student))).status).toBe(404);
    const day = await api().get('/api/day-schedule?date=2031-06-02').set(auth(priya));
    expect(day.body.examiners.map((e: { examiner: { displayName: string } }) => e.examiner.displayName)).toEqual(['Priya Halvorsen']);
    expect(day.body.rooms[0].room).toBe(room);
  });
});
