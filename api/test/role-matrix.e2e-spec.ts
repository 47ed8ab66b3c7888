import { randomUUID } from 'node:crypto';
import { api, tokenFor } from './e2e-support/api';
import { wavFile } from './support/media-fixtures';

/**
 * Every route × every caller → expected status (design.md §8). A new route must be added here:
 * the last test compares this table with the OpenAPI document.
 */
type Caller = 'none' | 'admin' | 'teacher' | 'examiner' | 'student' | 'otherOrgAdmin';
const CALLERS: Caller[] = ['none', 'admin', 'teacher', 'examiner', 'student', 'otherOrgAdmin'];
const EMAIL: Record<Exclude<Caller, 'none'>, string> = {
  admin: 'admin@demo.example',
  teacher: 'teacher@demo.example',
  examiner: 'examiner@demo.example',
  student: 'student@demo.example',
  otherOrgAdmin: 'admin@fernhill.example',
};

interface Ctx {
  /** A person in the demo school. */
  demoPersonId: string;
  /** The other organisation's id (nobody in the demo school but Beatrix belongs to it). */
  otherOrgId: string;
}

interface Row {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** OpenAPI path, e.g. /api/users/{id} */
  route: string;
  path: (c: Ctx, caller: Caller) => string;
  body?: (c: Ctx, caller: Caller) => object;
  /** A multipart upload in the form field `file` instead of a JSON body. */
  file?: () => { name: string; content: Buffer };
  expect: Record<Caller, number>;
}

const all = (n: number): Record<Caller, number> => ({ none: n, admin: n, teacher: n, examiner: n, student: n, otherOrgAdmin: n });
const members = (n: number): Record<Caller, number> => ({ ...all(n), none: 401 });
const adminOnly = (ok: number, otherOrg = ok): Record<Caller, number> => ({
  none: 401,
  admin: ok,
  teacher: 403,
  examiner: 403,
  student: 403,
  otherOrgAdmin: otherOrg,
});

// ---- Rubrics, requirement lists and students' fingerings (issue 3) ----------------------------
// Teachers and admins edit, examiners and students read published versions only, nobody outside
// the organisation sees anything (404); a published version answers 409 to an edit. Records that
// a row changes (publishing, a new version) are made per caller so each call meets a fresh one.
type Editor = 'admin' | 'teacher';
const editorOf = (caller: Caller): Editor => (caller === 'teacher' ? 'teacher' : 'admin');
interface TeachingCtx {
  rubricId: string;
  publishedRubricVersionId: string;
  draftRubricVersionId: string;
  /** Per editor: a draft to publish, and a rubric with no draft to start a new version of. */
  publishRubricDraft: Record<Editor, string>;
  rubricWithoutDraft: Record<Editor, string>;
  listId: string;
  publishedListVersionId: string;
  draftListVersionId: string;
  publishListDraft: Record<Editor, string>;
  listWithoutDraft: Record<Editor, string>;
  /** The demo student (taught by the demo teacher) and a student the demo teacher does not teach. */
  ownStudentId: string;
  otherStudentId: string;
}
const tc = {} as TeachingCtx;
const criteria = [{ key: 'note_accuracy', label: 'Note accuracy', weight: 1, maxMark: 4, descriptors: [{ min: 0, max: 4, text: 'As heard.' }] }];
const rubricBody = () => ({ name: 'Matrix rubric', kinds: ['scale'], criteria });
const listBody = () => ({
  name: 'Matrix list',
  grade: '2',
  totalMarks: 10,
  selectionRule: { count: 1, minPerKind: { scale: 1 } },
  lines: [
    {
      kind: 'scale',
      keys: ['C', 'G'],
      modes: ['major'],
      hands: ['RH', 'LH'],
      motions: [],
      octaves: [1],
      articulations: ['legato'],
      dynamics: [],
      inversions: [],
      tempo: { bpm: 60, beatUnit: 'quarter', notesPerBeat: 2 },
      rubricVersionId: tc.publishedRubricVersionId,
      difficultyWeight: 1,
    },
  ],
});
// C major, one octave, right hand, up: 1-2-3-1-2-3-4-5 (common practice).
const fingeringBody = () => ({ kind: 'scale', key: 'C', mode: 'major', hand: 'RH', octaves: 1, direction: 'up', digits: [1, 2, 3, 1, 2, 3, 4, 5] });
const editors = (ok: number, otherOrg = 404): Record<Caller, number> => ({ none: 401, admin: ok, teacher: ok, examiner: 403, student: 403, otherOrgAdmin: otherOrg });
const readers = (): Record<Caller, number> => ({ ...members(200), otherOrgAdmin: 404 });

async function prepareTeaching(): Promise<void> {
  const as = async (email: string) => ({ Authorization: `Bearer ${await tokenFor(email)}` });
  const admin = await as(EMAIL.admin);
  const teacher = await as(EMAIL.teacher);
  const ok = <T>(res: { status: number; body: T; text: string }, status: number): T => {
    if (res.status !== status) throw new Error(`setup: expected ${status}, got ${res.status} ${res.text}`);
    return res.body;
  };
  const rubrics = ok(await api().get('/api/rubrics').set(admin), 200) as { id: string; starterKey: string | null; published: { id: string } | null }[];
  const scales = rubrics.find((r) => r.starterKey === 'scales');
  if (!scales?.published) throw new Error('setup: the starter library is not in the demo school');
  tc.rubricId = scales.id;
  tc.publishedRubricVersionId = scales.published.id;
  const newRubric = async () => ok(await api().post('/api/rubrics').set(teacher).send(rubricBody()), 201) as { id: string; rubricId: string };
  const publishRubric = async (id: string) => ok(await api().post(`/api/rubric-versions/${id}/publish`).set(teacher), 200);
  tc.draftRubricVersionId = (await newRubric()).id;
  tc.publishRubricDraft = { admin: (await newRubric()).id, teacher: (await newRubric()).id };
  tc.rubricWithoutDraft = { admin: '', teacher: '' };
  for (const e of ['admin', 'teacher'] as const) {
    const r = await newRubric();
    await publishRubric(r.id);
    tc.rubricWithoutDraft[e] = r.rubricId;
  }

  const lists = ok(await api().get('/api/requirement-lists').set(admin), 200) as { id: string; starterKey: string | null; published: { id: string } | null }[];
  const grade1 = lists.find((l) => l.starterKey === 'grade-1');
  if (!grade1?.published) throw new Error('setup: the starter lists are not in the demo school');
  tc.listId = grade1.id;
  tc.publishedListVersionId = grade1.published.id;
  const newList = async () => ok(await api().post('/api/requirement-lists').set(teacher).send(listBody()), 201) as { id: string; listId: string };
  tc.draftListVersionId = (await newList()).id;
  tc.publishListDraft = { admin: (await newList()).id, teacher: (await newList()).id };
  tc.listWithoutDraft = { admin: '', teacher: '' };
  for (const e of ['admin', 'teacher'] as const) {
    const l = await newList();
    ok(await api().post(`/api/requirement-list-versions/${l.id}/publish`).set(teacher), 200);
    tc.listWithoutDraft[e] = l.listId;
  }

  const student = async (search: string) => {
    const rows = ok(await api().get(`/api/students?search=${search}`).set(admin), 200) as { id: string; pupilNumber: string }[];
    const row = rows.find((r) => r.pupilNumber === search);
    if (!row) throw new Error(`setup: no student ${search}`);
    return row.id;
  };
  tc.ownStudentId = await student('KL1021'); // Ellis Northcott, THU-SNR, taught by the demo teacher
  tc.otherStudentId = await student('KL1031'); // Elodie Merrow, SAT-DIP only, taught by someone else
}

const TEACHING_ROWS: Row[] = [
  { method: 'get', route: '/api/rubrics', path: () => '/api/rubrics', expect: members(200) },
  { method: 'post', route: '/api/rubrics', path: () => '/api/rubrics', body: rubricBody, expect: editors(201, 201) },
  {
    method: 'post',
    route: '/api/rubrics/import',
    path: () => '/api/rubrics/import',
    file: () => ({ name: 'matrix.rubric.json', content: Buffer.from(JSON.stringify({ format: 'stavemark.rubric', formatVersion: 1, rubric: rubricBody() })) }),
    expect: editors(201, 201),
  },
  { method: 'get', route: '/api/rubrics/{id}', path: () => `/api/rubrics/${tc.rubricId}`, expect: readers() },
  { method: 'post', route: '/api/rubrics/{id}/versions', path: (_c, caller) => `/api/rubrics/${tc.rubricWithoutDraft[editorOf(caller)]}/versions`, body: rubricBody, expect: editors(201) },
  { method: 'get', route: '/api/rubric-versions/{id}', path: () => `/api/rubric-versions/${tc.publishedRubricVersionId}`, expect: readers() },
  // A draft is not given to examiners and students.
  { method: 'get', route: '/api/rubric-versions/{id}', path: () => `/api/rubric-versions/${tc.draftRubricVersionId}`, expect: { ...editors(200), examiner: 404, student: 404 } },
  { method: 'put', route: '/api/rubric-versions/{id}', path: () => `/api/rubric-versions/${tc.draftRubricVersionId}`, body: rubricBody, expect: editors(200) },
  // A published version never changes.
  { method: 'put', route: '/api/rubric-versions/{id}', path: () => `/api/rubric-versions/${tc.publishedRubricVersionId}`, body: rubricBody, expect: editors(409) },
  { method: 'post', route: '/api/rubric-versions/{id}/publish', path: (_c, caller) => `/api/rubric-versions/${tc.publishRubricDraft[editorOf(caller)]}/publish`, expect: editors(200) },
  { method: 'post', route: '/api/rubric-versions/{id}/publish', path: () => `/api/rubric-versions/${tc.publishedRubricVersionId}/publish`, expect: editors(409) },
  { method: 'get', route: '/api/rubric-versions/{id}/export', path: () => `/api/rubric-versions/${tc.publishedRubricVersionId}/export`, expect: readers() },

  { method: 'get', route: '/api/requirement-lists', path: () => '/api/requirement-lists', expect: members(200) },
  // Another organisation cannot build a list on our rubric version: it is not there for them.
  { method: 'post', route: '/api/requirement-lists', path: () => '/api/requirement-lists', body: listBody, expect: editors(201, 400) },
  { method: 'get', route: '/api/requirement-lists/{id}', path: () => `/api/requirement-lists/${tc.listId}`, expect: readers() },
  { method: 'post', route: '/api/requirement-lists/{id}/versions', path: (_c, caller) => `/api/requirement-lists/${tc.listWithoutDraft[editorOf(caller)]}/versions`, body: listBody, expect: editors(201) },
  { method: 'get', route: '/api/requirement-list-versions/{id}', path: () => `/api/requirement-list-versions/${tc.publishedListVersionId}`, expect: readers() },
  { method: 'get', route: '/api/requirement-list-versions/{id}', path: () => `/api/requirement-list-versions/${tc.draftListVersionId}`, expect: { ...editors(200), examiner: 404, student: 404 } },
  { method: 'put', route: '/api/requirement-list-versions/{id}', path: () => `/api/requirement-list-versions/${tc.draftListVersionId}`, body: listBody, expect: editors(200) },
  { method: 'put', route: '/api/requirement-list-versions/{id}', path: () => `/api/requirement-list-versions/${tc.publishedListVersionId}`, body: listBody, expect: editors(409) },
  { method: 'post', route: '/api/requirement-list-versions/{id}/publish', path: (_c, caller) => `/api/requirement-list-versions/${tc.publishListDraft[editorOf(caller)]}/publish`, expect: editors(200) },

  // Fingerings: the student's own teachers and admins set them; the student reads their own.
  { method: 'get', route: '/api/students/{studentId}/fingerings', path: () => `/api/students/${tc.ownStudentId}/fingerings`, expect: { ...members(200), examiner: 404, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/students/{studentId}/fingerings', path: () => `/api/students/${tc.otherStudentId}/fingerings`, expect: { ...members(404), admin: 200 } },
  { method: 'post', route: '/api/students/{studentId}/fingerings', path: () => `/api/students/${tc.ownStudentId}/fingerings`, body: fingeringBody, expect: editors(201) },
  { method: 'post', route: '/api/students/{studentId}/fingerings', path: () => `/api/students/${tc.otherStudentId}/fingerings`, body: fingeringBody, expect: { ...editors(201), teacher: 404 } },

  // The starter library: teachers and admins of any school; the demo school has every entry from
  // the seed (409), the other school adds its first copy (201); examiners and students never.
  { method: 'get', route: '/api/starter-library', path: () => '/api/starter-library', expect: editors(200, 200) },
  { method: 'post', route: '/api/starter-library/rubrics', path: () => '/api/starter-library/rubrics', body: () => ({ key: 'passages' }), expect: editors(409, 201) },
  { method: 'post', route: '/api/starter-library/requirement-lists', path: () => '/api/starter-library/requirement-lists', body: () => ({ key: 'grade-1' }), expect: editors(409, 201) },
];

// ---- Classes, class-list import, students, account links and the Outbox (issue 4) --------------
// A teacher reaches only the classes they teach and the students in them: another teacher's class
// or student answers 404, as does anything of another organisation.
interface ClassCtx {
  ownClassId: string;
  otherTeachersClassId: string;
  ownStudentId: string;
  otherTeachersStudentId: string;
  /** A class of the demo teacher's with one member per editor to take out. */
  removalClassId: string;
  removable: Record<'admin' | 'teacher', string>;
}
const cc = {} as ClassCtx;
const staff = (ok: number, otherOrg = ok): Record<Caller, number> => ({ none: 401, admin: ok, teacher: ok, examiner: 403, student: 403, otherOrgAdmin: otherOrg });
const ownOnly = (ok: number): Record<Caller, number> => ({ ...staff(ok, 404), teacher: 404 });
const FAKE_TOKEN = 'A'.repeat(43);
const importCsv = (caller: Caller): Buffer =>
  Buffer.from(
    'Pupil number,Given name,Family name,Student e-mail,Date of birth,Guardian name,Guardian e-mail,Grade,Class code\r\n' +
      `MX-${caller},Matrix,Pupil,,2000-01-01,,,3,MATRIX-${caller.toUpperCase()}\r\n`,
  );

async function prepareClasses(): Promise<void> {
  const admin = { Authorization: `Bearer ${await tokenFor(EMAIL.admin)}` };
  const teacher = { Authorization: `Bearer ${await tokenFor(EMAIL.teacher)}` };
  const ok = <T>(res: { status: number; body: T; text: string }, status: number): T => {
    if (res.status !== status) throw new Error(`setup: expected ${status}, got ${res.status} ${res.text}`);
    return res.body;
  };
  const classes = ok(await api().get('/api/classes').set(admin), 200) as { id: string; code: string }[];
  cc.ownClassId = classes.find((c) => c.code === 'MON-FND')!.id; // taught by the demo teacher
  cc.otherTeachersClassId = classes.find((c) => c.code === 'SAT-DIP')!.id; // taught by someone else
  const student = async (pn: string) => (ok(await api().get(`/api/students?search=${pn}`).set(admin), 200) as { id: string }[])[0]!.id;
  cc.ownStudentId = await student('KL1004');
  cc.otherTeachersStudentId = await student('KL1031');
  const created = ok(await api().post('/api/classes').set(teacher).send({ name: 'Matrix removals', code: `MATRIX-RM-${Date.now()}` }), 201) as { id: string };
  cc.removalClassId = created.id;
  cc.removable = { admin: await student('KL1001'), teacher: await student('KL1002') };
  for (const id of Object.values(cc.removable)) ok(await api().post(`/api/classes/${created.id}/members`).set(teacher).send({ studentId: id }), 200);
}

const CLASS_ROWS: Row[] = [
  { method: 'get', route: '/api/classes', path: () => '/api/classes', expect: staff(200) },
  { method: 'post', route: '/api/classes', path: () => '/api/classes', body: (_c, caller) => ({ name: 'Matrix class', code: `MX-${caller}-${Date.now()}-${seq++}` }), expect: staff(201) },
  { method: 'get', route: '/api/classes/import/template', path: () => '/api/classes/import/template', expect: staff(200) },
  // A dry run into a new class code of the caller's own organisation.
  { method: 'post', route: '/api/classes/import', path: () => '/api/classes/import?dryRun=true', file: () => ({ name: 'matrix.csv', content: importCsv('teacher') }), expect: staff(200) },
  // An import nobody sent with this progress id: staff learn nothing (404), others are refused.
  { method: 'get', route: '/api/classes/import/progress/{progressId}', path: () => `/api/classes/import/progress/${randomUUID()}`, expect: staff(404) },
  { method: 'get', route: '/api/classes/{id}', path: () => `/api/classes/${cc.ownClassId}`, expect: staff(200, 404) },
  { method: 'get', route: '/api/classes/{id}', path: () => `/api/classes/${cc.otherTeachersClassId}`, expect: ownOnly(200) },
  { method: 'patch', route: '/api/classes/{id}', path: () => `/api/classes/${cc.ownClassId}`, body: () => ({ name: 'Monday Foundations' }), expect: staff(200, 404) },
  { method: 'patch', route: '/api/classes/{id}', path: () => `/api/classes/${cc.otherTeachersClassId}`, body: () => ({ name: 'Saturday Diploma Preparation' }), expect: ownOnly(200) },
  { method: 'get', route: '/api/classes/{id}/export', path: () => `/api/classes/${cc.ownClassId}/export`, expect: staff(200, 404) },
  { method: 'get', route: '/api/classes/{id}/export', path: () => `/api/classes/${cc.otherTeachersClassId}/export`, expect: ownOnly(200) },
  // Adding a student who is already a member changes nothing.
  { method: 'post', route: '/api/classes/{id}/members', path: () => `/api/classes/${cc.ownClassId}/members`, body: () => ({ studentId: cc.ownStudentId }), expect: staff(200, 404) },
  { method: 'post', route: '/api/classes/{id}/members', path: () => `/api/classes/${cc.otherTeachersClassId}/members`, body: () => ({ studentId: cc.otherTeachersStudentId }), expect: ownOnly(200) },
  {
    method: 'delete',
    route: '/api/classes/{id}/members/{studentId}',
    path: (_c, caller) => `/api/classes/${cc.removalClassId}/members/${cc.removable[caller === 'teacher' ? 'teacher' : 'admin']}`,
    expect: staff(204, 404),
  },
  { method: 'get', route: '/api/students', path: () => '/api/students?search=KL10', expect: staff(200) },
  { method: 'patch', route: '/api/students/{id}', path: () => `/api/students/${cc.ownStudentId}`, body: () => ({ active: true }), expect: staff(200, 404) },
  { method: 'patch', route: '/api/students/{id}', path: () => `/api/students/${cc.otherTeachersStudentId}`, body: () => ({ active: true }), expect: ownOnly(200) },
  // Public link routes: an unknown link answers 400 to anyone; "forgot password" always 202.
  { method: 'post', route: '/api/account/link', path: () => '/api/account/link', body: () => ({ token: FAKE_TOKEN }), expect: all(400) },
  { method: 'post', route: '/api/account/accept-invitation', path: () => '/api/account/accept-invitation', body: () => ({ token: FAKE_TOKEN, password: 'a-long-enough-password' }), expect: all(400) },
  { method: 'post', route: '/api/account/reset-password', path: () => '/api/account/reset-password', body: () => ({ token: FAKE_TOKEN, password: 'a-long-enough-password' }), expect: all(400) },
  { method: 'post', route: '/api/account/forgot-password', path: () => '/api/account/forgot-password', body: (_c, caller) => ({ email: `nobody.${caller}@demo.example` }), expect: all(202) },
  { method: 'post', route: '/api/account/consent/request', path: () => '/api/account/consent/request', body: () => ({ token: FAKE_TOKEN }), expect: all(400) },
  {
    method: 'post',
    route: '/api/account/consent',
    path: () => '/api/account/consent',
    body: () => ({ token: FAKE_TOKEN, answers: [{ studentId: '00000000-0000-4000-8000-000000000000', consentResultsEmail: true, consentRecordings: false }] }),
    expect: all(400),
  },
  { method: 'get', route: '/api/dev/outbox', path: () => '/api/dev/outbox', expect: adminOnly(200) },
];

// ---- The marking desk (issue 6) ---------------------------------------------------------------
// Examiners only, and only the slots they mark: a slot or sheet of another examiner is not there
// (404). Two sittings of their own this evening (other rooms), so the demo sitting stays as seeded.
interface MarkingCtx {
  slotId: string;
  sheetId: string;
  otherSlotId: string;
}
const mc = {} as MarkingCtx;
const examinerOnly = (ok: number): Record<Caller, number> => ({ none: 401, admin: 403, teacher: 403, examiner: ok, student: 403, otherOrgAdmin: 403 });

async function prepareMarking(): Promise<void> {
  const teacher = { Authorization: `Bearer ${await tokenFor(EMAIL.teacher)}` };
  const admin = { Authorization: `Bearer ${await tokenFor(EMAIL.admin)}` };
  const examiner = { Authorization: `Bearer ${await tokenFor(EMAIL.examiner)}` };
  const ok = <T>(res: { status: number; body: T; text: string }, status: number): T => {
    if (res.status !== status) throw new Error(`setup: expected ${status}, got ${res.status} ${res.text}`);
    return res.body;
  };
  const { date } = ok(await api().get('/api/today').set(teacher), 200) as { date: string };
  const lists = ok(await api().get('/api/requirement-lists').set(admin), 200) as { starterKey: string | null; published: { id: string } | null }[];
  const g1 = lists.find((l) => l.starterKey === 'grade-1')!.published!.id;
  const ex = ok(await api().get('/api/examiners').set(admin), 200) as { id: string; email: string }[];
  const byEmail = (e: string) => ex.find((x) => x.email === e)!.id;
  const pupil = async (pn: string) => (ok(await api().get(`/api/students?search=${pn}`).set(admin), 200) as { id: string; pupilNumber: string }[]).find((s) => s.pupilNumber === pn)!.id;
  const sitting = async (room: string, examinerId: string, pn: string, open: boolean) => {
    const body = { title: `Matrix ${room}`, date, room, dayStart: '20:00', dayEnd: '23:30', papers: [{ listVersionId: g1 }], examinerIds: [examinerId] };
    const created = ok(await api().post('/api/sittings').set(teacher).send(body), 201) as { id: string };
    ok(await api().post(`/api/sittings/${created.id}/candidates`).set(teacher).send({ studentIds: [await pupil(pn)] }), 200);
    let v = ok(await api().post(`/api/sittings/${created.id}/status`).set(teacher).send({ status: 'scheduled' }), 200) as { slots: { id: string }[] };
    if (open) v = ok(await api().post(`/api/sittings/${created.id}/status`).set(teacher).send({ status: 'in_progress' }), 200) as { slots: { id: string }[] };
    return v.slots[0]!.id;
  };
  mc.slotId = await sitting('Marking M1', byEmail(EMAIL.examiner), 'KL1007', true);
  // Ottilie's sitting: Priya does not mark it.
  mc.otherSlotId = await sitting('Marking M2', byEmail('ottilie.brandt@demo.example'), 'KL1009', false);
  const desk = ok(await api().post(`/api/slots/${mc.slotId}/start`).set(examiner), 200) as { sheet: { id: string } };
  mc.sheetId = desk.sheet.id;
}

const MARKING_ROWS: Row[] = [
  { method: 'get', route: '/api/marking/today', path: () => '/api/marking/today', expect: examinerOnly(200) },
  { method: 'get', route: '/api/slots/{id}/desk', path: () => `/api/slots/${mc.slotId}/desk`, expect: examinerOnly(200) },
  { method: 'get', route: '/api/slots/{id}/desk', path: () => `/api/slots/${mc.otherSlotId}/desk`, expect: examinerOnly(404) },
  // Starting again answers the same draw and sheet.
  { method: 'post', route: '/api/slots/{id}/start', path: () => `/api/slots/${mc.slotId}/start`, expect: examinerOnly(200) },
  { method: 'post', route: '/api/slots/{id}/start', path: () => `/api/slots/${mc.otherSlotId}/start`, expect: examinerOnly(404) },
  { method: 'post', route: '/api/slots/{id}/request-changes', path: () => `/api/slots/${mc.slotId}/request-changes`, body: () => ({ index: 0, octaves: 1, reason: 'Matrix check' }), expect: examinerOnly(200) },
  { method: 'post', route: '/api/slots/{id}/request-changes', path: () => `/api/slots/${mc.otherSlotId}/request-changes`, body: () => ({ index: 0, octaves: 1, reason: 'Matrix check' }), expect: examinerOnly(404) },
  // Not submitted: nobody but its examiner sees it (blind second marking), not even an admin.
  { method: 'get', route: '/api/mark-sheets/{id}', path: () => `/api/mark-sheets/${mc.sheetId}`, expect: { ...examinerOnly(200), admin: 404, otherOrgAdmin: 404 } },
  { method: 'post', route: '/api/mark-sheets/{id}/cells', path: () => `/api/mark-sheets/${mc.sheetId}/cells`, body: () => ({ changeId: randomUUID(), cell: 'flag:0:slip', value: 1, baseVersion: 0 }), expect: examinerOnly(200) },
  // No outcome yet: refused with the reason; a correction needs a submitted sheet.
  { method: 'post', route: '/api/mark-sheets/{id}/submit', path: () => `/api/mark-sheets/${mc.sheetId}/submit`, body: () => ({ lastChangeId: null, confirm: true }), expect: examinerOnly(400) },
  { method: 'post', route: '/api/mark-sheets/{id}/corrections', path: () => `/api/mark-sheets/${mc.sheetId}/corrections`, body: () => ({ changeId: randomUUID(), cell: 'flag:0:slip', value: 1, reason: 'Matrix check' }), expect: examinerOnly(409) },
];

// ---- Sittings (issue 5) ----------------------------------------------------------------------
// Teachers and admins plan; examiners see only the scheduled sittings whose panel they sit on and
// the slots they mark; students only sittings they take part in (their own slot); another
// organisation's anything is 404. Records a row changes are made per caller where it matters.
interface SittingCtx {
  todayId: string;
  /** Scheduled, Ottilie's panel only, Ada the only candidate: neither the examiner nor the student may see it. */
  unassignedId: string;
  /** A draft of the demo teacher's, panel Priya + Ottilie, lists grade 3 and grade 1. */
  draftId: string;
  moveSlotId: string;
  swapWithSlotId: string;
  removable: Record<Editor, string>;
  deletable: Record<Editor, string>;
  /** Scheduled, Priya's panel: a slot for outcomes, and two withdrawn attempts to re-sit. */
  outcomeSlotId: string;
  resitOf: Record<Editor, string>;
  wrenId: string;
  bramId: string;
  g1: string;
  g3: string;
  examiners: { priya: string; ottilie: string };
}
const sc = {} as SittingCtx;
const sittingDay = (date: string, room: string, over: object = {}) => ({
  title: `Matrix ${room}`,
  date,
  room,
  dayStart: '09:00',
  dayEnd: '12:00',
  papers: [{ listVersionId: sc.g3 }, { listVersionId: sc.g1 }],
  examinerIds: [sc.examiners.priya, sc.examiners.ottilie],
  ...over,
});
const planners = (ok: number, otherOrg = 404): Record<Caller, number> => ({ none: 401, admin: ok, teacher: ok, examiner: 403, student: 403, otherOrgAdmin: otherOrg });

async function prepareSittings(): Promise<void> {
  const admin = { Authorization: `Bearer ${await tokenFor(EMAIL.admin)}` };
  const teacher = { Authorization: `Bearer ${await tokenFor(EMAIL.teacher)}` };
  const ok = <T>(res: { status: number; body: T; text: string }, status: number): T => {
    if (res.status !== status) throw new Error(`setup: expected ${status}, got ${res.status} ${res.text}`);
    return res.body;
  };
  const lists = ok(await api().get('/api/requirement-lists').set(admin), 200) as { starterKey: string | null; published: { id: string } | null }[];
  sc.g1 = lists.find((l) => l.starterKey === 'grade-1')!.published!.id;
  sc.g3 = lists.find((l) => l.starterKey === 'grade-3')!.published!.id;
  const ex = ok(await api().get('/api/examiners').set(admin), 200) as { id: string; email: string }[];
  sc.examiners = { priya: ex.find((e) => e.email === EMAIL.examiner)!.id, ottilie: ex.find((e) => e.email === 'ottilie.brandt@demo.example')!.id };
  const sittings = ok(await api().get('/api/sittings').set(admin), 200) as { id: string; title: string; status: string }[];
  sc.todayId = sittings.find((s) => s.title === 'Grade 5 mock — Thursday Seniors')!.id;
  const student = async (pn: string) => (ok(await api().get(`/api/students?search=${pn}`).set(admin), 200) as { id: string; pupilNumber: string }[]).find((s) => s.pupilNumber === pn)!.id;
  const ids = Object.fromEntries(await Promise.all(['KL1001', 'KL1002', 'KL1003', 'KL1005', 'KL1011', 'KL1013', 'KL1015', 'KL1017', 'KL1019', 'KL1023'].map(async (pn) => [pn, await student(pn)])));
  sc.wrenId = ids.KL1023!;
  sc.bramId = ids.KL1002!;
  type View = { id: string; slots: { id: string; studentId: string }[] };
  const plan = async (body: object, studentIds: string[], schedule: boolean): Promise<View> => {
    const s = ok(await api().post('/api/sittings').set(teacher).send(body), 201) as View;
    let v = s;
    if (studentIds.length) v = ok(await api().post(`/api/sittings/${s.id}/candidates`).set(teacher).send({ studentIds }), 200) as View;
    if (schedule) v = ok(await api().post(`/api/sittings/${s.id}/status`).set(teacher).send({ status: 'scheduled' }), 200) as View;
    return v;
  };
  const slotFor = (v: View, sid: string) => v.slots.find((s) => s.studentId === sid)!.id;
  await plan(sittingDay('2030-01-07', 'Matrix A', { examinerIds: [sc.examiners.ottilie] }), [ids.KL1001!], true).then((v) => (sc.unassignedId = v.id));
  const draft = await plan(sittingDay('2030-01-08', 'Matrix B'), [ids.KL1011!, ids.KL1013!, ids.KL1015!, ids.KL1017!], false);
  sc.draftId = draft.id;
  sc.moveSlotId = slotFor(draft, ids.KL1011!);
  sc.swapWithSlotId = slotFor(draft, ids.KL1013!);
  sc.removable = { admin: slotFor(draft, ids.KL1015!), teacher: slotFor(draft, ids.KL1017!) };
  sc.deletable = {
    admin: (ok(await api().post('/api/sittings').set(teacher).send(sittingDay('2030-01-10', 'Matrix D1')), 201) as View).id,
    teacher: (ok(await api().post('/api/sittings').set(teacher).send(sittingDay('2030-01-10', 'Matrix D2')), 201) as View).id,
  };
  const scheduled = await plan(sittingDay('2030-01-09', 'Matrix C', { examinerIds: [sc.examiners.priya] }), [ids.KL1019!, ids.KL1003!, ids.KL1005!], true);
  sc.outcomeSlotId = slotFor(scheduled, ids.KL1019!);
  sc.resitOf = { admin: slotFor(scheduled, ids.KL1003!), teacher: slotFor(scheduled, ids.KL1005!) };
  for (const id of Object.values(sc.resitOf)) ok(await api().post(`/api/slots/${id}/outcome`).set(teacher).send({ outcome: 'withdrawn' }), 200);
}

const SITTING_ROWS: Row[] = [
  { method: 'get', route: '/api/sittings', path: () => '/api/sittings', expect: members(200) },
  // Another organisation cannot plan on our requirement list: it is not there for them.
  { method: 'post', route: '/api/sittings', path: () => '/api/sittings', body: (_c, caller) => sittingDay('2030-02-04', `Matrix new ${caller} ${seq++}`), expect: planners(201, 400) },
  { method: 'get', route: '/api/sittings/{id}', path: () => `/api/sittings/${sc.todayId}`, expect: { ...members(200), otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/sittings/{id}', path: () => `/api/sittings/${sc.unassignedId}`, expect: { ...members(200), examiner: 404, student: 404, otherOrgAdmin: 404 } },
  // A draft is not shown to examiners, even on its panel.
  { method: 'patch', route: '/api/sittings/{id}', path: () => `/api/sittings/${sc.draftId}`, body: () => ({ title: 'Matrix B' }), expect: planners(200) },
  { method: 'delete', route: '/api/sittings/{id}', path: (_c, caller) => `/api/sittings/${sc.deletable[editorOf(caller)]}`, expect: planners(204) },
  // Adding someone already there skips them: the second call changes nothing.
  { method: 'post', route: '/api/sittings/{id}/candidates', path: () => `/api/sittings/${sc.draftId}/candidates`, body: () => ({ studentIds: [sc.bramId] }), expect: planners(200) },
  { method: 'post', route: '/api/sittings/{id}/double-marking', path: () => `/api/sittings/${sc.draftId}/double-marking`, body: () => ({ share: 0 }), expect: planners(200) },
  // A draft cannot jump to published (409); an examiner cannot see a draft at all.
  { method: 'post', route: '/api/sittings/{id}/status', path: () => `/api/sittings/${sc.draftId}/status`, body: () => ({ status: 'published' }), expect: { ...planners(409), examiner: 404 } },
  { method: 'get', route: '/api/sittings/{id}/calendar', path: () => `/api/sittings/${sc.todayId}/calendar`, expect: { ...members(200), otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/sittings/{id}/calendar', path: () => `/api/sittings/${sc.unassignedId}/calendar`, expect: { ...members(200), examiner: 404, student: 404, otherOrgAdmin: 404 } },
  { method: 'patch', route: '/api/slots/{id}', path: () => `/api/slots/${sc.moveSlotId}`, body: () => ({ notBefore: null }), expect: planners(200) },
  { method: 'post', route: '/api/slots/{id}/move', path: () => `/api/slots/${sc.moveSlotId}/move`, body: (_c, caller) => ({ direction: caller === 'admin' ? 'later' : 'earlier' }), expect: planners(200) },
  { method: 'post', route: '/api/slots/{id}/swap', path: () => `/api/slots/${sc.moveSlotId}/swap`, body: () => ({ withSlotId: sc.swapWithSlotId }), expect: planners(200) },
  { method: 'delete', route: '/api/slots/{id}', path: (_c, caller) => `/api/slots/${sc.removable[editorOf(caller)]}`, expect: planners(200) },
  // The examiner who marks the slot may record its outcome (a withdrawal, before the day).
  { method: 'post', route: '/api/slots/{id}/outcome', path: () => `/api/slots/${sc.outcomeSlotId}/outcome`, body: () => ({ outcome: 'withdrawn' }), expect: { ...planners(200), examiner: 200 } },
  { method: 'post', route: '/api/slots/{id}/resit', path: (_c, caller) => `/api/slots/${sc.resitOf[editorOf(caller)]}/resit`, body: () => ({ sittingId: sc.draftId }), expect: planners(201) },
  // Each organisation's own day; students have their own slot on the sitting instead.
  { method: 'get', route: '/api/day-schedule', path: () => '/api/day-schedule?date=2030-01-09', expect: { ...members(200), student: 403 } },
  { method: 'get', route: '/api/examiners', path: () => '/api/examiners', expect: planners(200, 200) },
  // Confidential: an examiner sees an arrangement only while marking that candidate.
  { method: 'get', route: '/api/students/{id}/access-arrangement', path: () => `/api/students/${sc.wrenId}/access-arrangement`, expect: { ...planners(200), examiner: 404 } },
  { method: 'get', route: '/api/students/{id}/access-arrangement', path: () => `/api/students/${tc.otherStudentId}/access-arrangement`, expect: { ...planners(200), teacher: 404, examiner: 404 } },
  { method: 'put', route: '/api/students/{id}/access-arrangement', path: () => `/api/students/${sc.bramId}/access-arrangement`, body: () => ({ extraTimePercent: 10, restBreakMinutes: 0, substitutions: [] }), expect: planners(200) },
  { method: 'put', route: '/api/students/{id}/access-arrangement', path: () => `/api/students/${tc.otherStudentId}/access-arrangement`, body: () => ({ extraTimePercent: 10, restBreakMinutes: 0, substitutions: [] }), expect: { ...planners(200), teacher: 404 } },
  { method: 'get', route: '/api/band-policy', path: () => '/api/band-policy', expect: planners(200, 200) },
  {
    method: 'post',
    route: '/api/band-policy',
    path: () => '/api/band-policy',
    body: () => ({ bands: [{ key: 'distinction', label: 'Distinction', minPercent: 80 }, { key: 'merit', label: 'Merit', minPercent: 70 }, { key: 'pass', label: 'Pass', minPercent: 55 }], below: { key: 'not_yet_passed', label: 'Not yet passed' } }),
    expect: adminOnly(201),
  },
];

// ---- Agreement report and standardisation (issue 7) -------------------------------------------
// A sitting's report: admins, its planner, its lead examiner; a term's: admins and teachers.
// Exercises: admins and teachers write them, examiners mark published ones blind; a draft is its
// author's and the admins'; another organisation's exercise or term is 404.
interface AgreementCtx {
  termId: string;
  demoExerciseId: string;
  /** A teacher's draft (edited by PATCH rows), and per editor a complete draft to publish. */
  draftId: string;
  publishable: Record<Editor, string>;
  /** Published for the matrix, so attempts on it leave the demo exercise to the browser journey. */
  attemptId: string;
  criteria: { key: string; maxMark: number }[];
}
const ac = {} as AgreementCtx;
const exerciseBody = (title: string, marks = true) => ({
  title,
  rubricVersionId: tc.publishedRubricVersionId,
  requests: [{ title: 'C major scale', details: 'hands together, two octaves' }],
  referenceMarks: marks ? ac.criteria.map((c) => ({ request: 0, criterion: c.key, mark: Math.min(2, c.maxMark) })) : [],
});

async function prepareAgreement(): Promise<void> {
  const teacher = { Authorization: `Bearer ${await tokenFor(EMAIL.teacher)}` };
  const admin = { Authorization: `Bearer ${await tokenFor(EMAIL.admin)}` };
  const ok = <T>(res: { status: number; body: T; text: string }, status: number): T => {
    if (res.status !== status) throw new Error(`setup: expected ${status}, got ${res.status} ${res.text}`);
    return res.body;
  };
  const scopes = ok(await api().get('/api/agreement/scopes').set(admin), 200) as { terms: { id: string }[] };
  ac.termId = scopes.terms[0]!.id;
  const list = ok(await api().get('/api/standardisation/exercises').set(admin), 200) as { id: string; title: string }[];
  ac.demoExerciseId = list.find((e) => e.title.startsWith('D major scale'))!.id;
  const rubric = ok(await api().get(`/api/rubric-versions/${tc.publishedRubricVersionId}`).set(admin), 200) as { criteria: { key: string; maxMark: number }[] };
  ac.criteria = rubric.criteria;
  const create = async (title: string, marks = true, who = teacher) => (ok(await api().post('/api/standardisation/exercises').set(who).send(exerciseBody(title, marks)), 201) as { id: string }).id;
  const attach = async (id: string, who = teacher) => ok(await api().post(`/api/standardisation/exercises/${id}/recording`).set(who).attach('file', wavFile({ seconds: 1 }), { filename: 'reference.wav' }), 200);
  ac.draftId = await create('Matrix draft exercise', false);
  ac.publishable = { admin: await create('Matrix publish A', true, admin), teacher: await create('Matrix publish T') };
  await attach(ac.publishable.admin, admin);
  await attach(ac.publishable.teacher);
  ac.attemptId = await create('Matrix attempt exercise');
  await attach(ac.attemptId);
  ok(await api().post(`/api/standardisation/exercises/${ac.attemptId}/publish`).set(teacher), 200);
}

const markers = (ok: number, otherOrg = 404): Record<Caller, number> => ({ none: 401, admin: ok, teacher: ok, examiner: ok, student: 403, otherOrgAdmin: otherOrg });
const AGREEMENT_ROWS: Row[] = [
  { method: 'get', route: '/api/agreement/scopes', path: () => '/api/agreement/scopes', expect: markers(200, 200) },
  // Today's sitting: planned by the demo teacher, Priya leads its panel.
  { method: 'get', route: '/api/sittings/{id}/agreement', path: () => `/api/sittings/${sc.todayId}/agreement`, expect: markers(200) },
  // Ottilie's panel only: Priya is not its lead examiner.
  { method: 'get', route: '/api/sittings/{id}/agreement', path: () => `/api/sittings/${sc.unassignedId}/agreement`, expect: { ...markers(200), examiner: 404 } },
  { method: 'get', route: '/api/terms/{id}/agreement', path: () => `/api/terms/${ac.termId}/agreement`, expect: planners(200) },
  { method: 'get', route: '/api/standardisation/exercises', path: () => '/api/standardisation/exercises', expect: markers(200, 200) },
  // Another organisation's admin names a rubric version that is not theirs: refused as invalid.
  { method: 'post', route: '/api/standardisation/exercises', path: () => '/api/standardisation/exercises', body: (_c, caller) => exerciseBody(`Matrix new ${caller} ${seq++}`), expect: planners(201, 400) },
  { method: 'get', route: '/api/standardisation/exercises/{id}', path: () => `/api/standardisation/exercises/${ac.demoExerciseId}`, expect: markers(200) },
  // A draft is its author's (the demo teacher) and the admins'.
  { method: 'get', route: '/api/standardisation/exercises/{id}', path: () => `/api/standardisation/exercises/${ac.draftId}`, expect: { ...markers(200), examiner: 404 } },
  { method: 'patch', route: '/api/standardisation/exercises/{id}', path: () => `/api/standardisation/exercises/${ac.draftId}`, body: () => ({ title: 'Matrix draft exercise' }), expect: planners(200) },
  // Published: fixed (409); it is not the demo teacher's to change at all (an admin wrote it).
  { method: 'patch', route: '/api/standardisation/exercises/{id}', path: () => `/api/standardisation/exercises/${ac.demoExerciseId}`, body: () => ({ title: 'Changed' }), expect: { ...planners(409), teacher: 404 } },
  // Streamed to storage, typed from its bytes; the draft's author and admins only.
  { method: 'post', route: '/api/standardisation/exercises/{id}/recording', path: () => `/api/standardisation/exercises/${ac.draftId}/recording`, file: () => ({ name: 'reference.wav', content: wavFile({ seconds: 1 }) }), expect: planners(200) },
  { method: 'get', route: '/api/standardisation/exercises/{id}/recording-url', path: () => `/api/standardisation/exercises/${ac.demoExerciseId}/recording-url`, expect: markers(200) },
  { method: 'post', route: '/api/standardisation/exercises/{id}/publish', path: (_c, caller) => `/api/standardisation/exercises/${ac.publishable[editorOf(caller)]}/publish`, expect: planners(200) },
  { method: 'put', route: '/api/standardisation/exercises/{id}/attempt', path: () => `/api/standardisation/exercises/${ac.attemptId}/attempt`, body: () => ({ marks: [] }), expect: examinerOnly(200) },
  // A draft is not there for an examiner.
  { method: 'put', route: '/api/standardisation/exercises/{id}/attempt', path: () => `/api/standardisation/exercises/${ac.draftId}/attempt`, body: () => ({ marks: [] }), expect: examinerOnly(404) },
  // Marks missing: 400 with each listed.
  { method: 'post', route: '/api/standardisation/exercises/{id}/attempt/submit', path: () => `/api/standardisation/exercises/${ac.attemptId}/attempt/submit`, body: () => ({ marks: [] }), expect: examinerOnly(400) },
  { method: 'get', route: '/api/standardisation/deviations', path: () => '/api/standardisation/deviations', expect: examinerOnly(200) },
];

// ---- Recordings (issue 6 §6) ---------------------------------------------------------------
// A slot's recordings: the candidate's teachers, admins, the candidate, and the slot's examiners
// while the sitting runs; another examiner's slot is not there (404). Uploads need a guardian's
// consent for a minor (Greta, KL1007, has it). Each deleting caller meets a recording of its own.
interface RecordingCtx {
  recordingId: string;
  deletable: Record<Editor, string>;
}
const rc = {} as RecordingCtx;
const wav = () => ({ name: 'matrix.wav', content: wavFile({ seconds: 0.25 }) });

async function prepareRecordings(): Promise<void> {
  const teacher = { Authorization: `Bearer ${await tokenFor(EMAIL.teacher)}` };
  const add = async () => {
    const res = await api().post(`/api/slots/${mc.slotId}/recordings`).set(teacher).attach('file', wavFile({ seconds: 0.25 }), { filename: 'setup.wav' });
    if (res.status !== 201) throw new Error(`setup: expected 201, got ${res.status} ${res.text}`);
    return (res.body as { id: string }).id;
  };
  rc.recordingId = await add();
  rc.deletable = { admin: await add(), teacher: await add() };
}

const RECORDING_ROWS: Row[] = [
  { method: 'get', route: '/api/slots/{id}/recordings', path: () => `/api/slots/${mc.slotId}/recordings`, expect: { ...members(200), student: 404, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/slots/{id}/recordings', path: () => `/api/slots/${mc.otherSlotId}/recordings`, expect: { ...members(200), examiner: 404, student: 404, otherOrgAdmin: 404 } },
  { method: 'post', route: '/api/slots/{id}/recordings', path: () => `/api/slots/${mc.slotId}/recordings`, file: wav, expect: { none: 401, admin: 201, teacher: 201, examiner: 403, student: 404, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/students/{id}/recordings', path: () => `/api/students/${tc.ownStudentId}/recordings`, expect: { ...members(200), examiner: 403, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/students/{id}/recordings', path: () => `/api/students/${tc.otherStudentId}/recordings`, expect: { ...members(200), teacher: 404, examiner: 403, student: 404, otherOrgAdmin: 404 } },
  { method: 'post', route: '/api/students/{id}/recordings', path: () => `/api/students/${tc.ownStudentId}/recordings`, file: wav, expect: { none: 401, admin: 201, teacher: 201, examiner: 403, student: 201, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/recordings/{id}/playback', path: () => `/api/recordings/${rc.recordingId}/playback`, expect: { ...members(200), student: 404, otherOrgAdmin: 404 } },
  { method: 'delete', route: '/api/recordings/{id}', path: (_c, caller) => `/api/recordings/${rc.deletable[editorOf(caller)]}`, expect: { none: 401, admin: 204, teacher: 204, examiner: 403, student: 404, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/recording-settings', path: () => '/api/recording-settings', expect: adminOnly(200) },
  { method: 'put', route: '/api/recording-settings', path: () => '/api/recording-settings', body: () => ({ retentionDays: 180 }), expect: adminOnly(200) },
  { method: 'put', route: '/api/sittings/{id}/recorded-exam', path: () => `/api/sittings/${sc.draftId}/recorded-exam`, body: () => ({ recordedExam: false }), expect: planners(200) },
];

// ---- Results, moderation and release (issue 7) ---------------------------------------------------
// Admins and teachers moderate and release (a teacher only for the students they teach, the
// planner for the whole sitting); students read their own released results. The demo Grade 3 mock
// is still in progress, so moderation and release answer 409 to those allowed; a sitting an admin
// planned for Tomasz's diploma pupil is not the demo teacher's to see (404).
interface ResultsCtx {
  openSittingId: string;
  openSlotId: string;
  foreignSittingId: string;
  foreignSlotId: string;
  ownStudentId: string;
  foreignStudentId: string;
  examinerId: string;
}
const resc = {} as ResultsCtx;

async function prepareResults(): Promise<void> {
  const admin = { Authorization: `Bearer ${await tokenFor(EMAIL.admin)}` };
  const ok = <T>(res: { status: number; body: T; text: string }, status: number): T => {
    if (res.status !== status) throw new Error(`setup: expected ${status}, got ${res.status} ${res.text}`);
    return res.body;
  };
  type View = { id: string; slots: { id: string; studentId: string }[] };
  const sittings = ok(await api().get('/api/sittings').set(admin), 200) as { id: string; title: string }[];
  resc.openSittingId = sittings.find((s) => s.title === 'Grade 3 mock — Wednesday Intermediates')!.id;
  resc.openSlotId = (ok(await api().get(`/api/sittings/${resc.openSittingId}`).set(admin), 200) as View).slots[0]!.id;
  const student = async (pn: string) => (ok(await api().get(`/api/students?search=${pn}`).set(admin), 200) as { id: string; pupilNumber: string }[]).find((s) => s.pupilNumber === pn)!.id;
  resc.ownStudentId = await student('KL1021');
  resc.foreignStudentId = await student('KL1031');
  const lists = ok(await api().get('/api/requirement-lists').set(admin), 200) as { starterKey: string | null; published: { id: string } | null }[];
  const g5 = lists.find((l) => l.starterKey === 'grade-5')!.published!.id;
  const ex = ok(await api().get('/api/examiners').set(admin), 200) as { id: string; email: string }[];
  resc.examinerId = ex.find((e) => e.email === 'beatrix.oduya@demo.example')!.id;
  const body = { title: 'Matrix results R1', date: '2030-01-11', room: 'Matrix R1', dayStart: '09:00', dayEnd: '12:00', papers: [{ listVersionId: g5 }], examinerIds: [ex.find((e) => e.email === EMAIL.examiner)!.id] };
  const created = ok(await api().post('/api/sittings').set(admin).send(body), 201) as View;
  ok(await api().post(`/api/sittings/${created.id}/candidates`).set(admin).send({ studentIds: [resc.foreignStudentId], listVersionId: g5 }), 200);
  const v = ok(await api().post(`/api/sittings/${created.id}/status`).set(admin).send({ status: 'scheduled' }), 200) as View;
  resc.foreignSittingId = v.id;
  resc.foreignSlotId = v.slots[0]!.id;
}

const moderators = (ok: number): Record<Caller, number> => ({ none: 401, admin: ok, teacher: ok, examiner: 403, student: 403, otherOrgAdmin: 404 });
const resultReaders = (ok: number): Record<Caller, number> => ({ none: 401, admin: ok, teacher: ok, examiner: 403, student: ok, otherOrgAdmin: 404 });
const agreeBody = () => ({ marks: { 'mark:0:note_accuracy': 5 }, reason: 'Matrix check of an agreement.' });
const RESULT_ROWS: Row[] = [
  { method: 'get', route: '/api/sittings/{id}/moderation', path: () => `/api/sittings/${resc.openSittingId}/moderation`, expect: moderators(409) },
  { method: 'get', route: '/api/sittings/{id}/moderation', path: () => `/api/sittings/${resc.foreignSittingId}/moderation`, expect: { ...moderators(409), teacher: 404 } },
  { method: 'post', route: '/api/moderation/slots/{slotId}/agree', path: () => `/api/moderation/slots/${resc.openSlotId}/agree`, body: agreeBody, expect: moderators(409) },
  { method: 'post', route: '/api/moderation/slots/{slotId}/agree', path: () => `/api/moderation/slots/${resc.foreignSlotId}/agree`, body: agreeBody, expect: { ...moderators(409), teacher: 404 } },
  { method: 'post', route: '/api/moderation/slots/{slotId}/third-marker', path: () => `/api/moderation/slots/${resc.openSlotId}/third-marker`, body: () => ({ examinerId: resc.examinerId }), expect: moderators(409) },
  { method: 'post', route: '/api/moderation/slots/{slotId}/third-marker', path: () => `/api/moderation/slots/${resc.foreignSlotId}/third-marker`, body: () => ({ examinerId: resc.examinerId }), expect: { ...moderators(409), teacher: 404 } },
  { method: 'post', route: '/api/sittings/{id}/release', path: () => `/api/sittings/${resc.openSittingId}/release`, body: () => ({}), expect: moderators(409) },
  { method: 'post', route: '/api/sittings/{id}/release', path: () => `/api/sittings/${resc.foreignSittingId}/release`, body: () => ({}), expect: { ...moderators(409), teacher: 404 } },
  { method: 'get', route: '/api/sittings/{id}/release', path: () => `/api/sittings/${resc.openSittingId}/release`, expect: moderators(200) },
  { method: 'get', route: '/api/sittings/{id}/release', path: () => `/api/sittings/${resc.foreignSittingId}/release`, expect: { ...moderators(200), teacher: 404 } },
  { method: 'get', route: '/api/me/results', path: () => '/api/me/results', expect: { none: 401, admin: 403, teacher: 403, examiner: 403, student: 200, otherOrgAdmin: 403 } },
  // The demo student's own results (none released yet: an empty list); another teacher's pupil: 404.
  { method: 'get', route: '/api/students/{studentId}/results', path: () => `/api/students/${resc.ownStudentId}/results`, expect: resultReaders(200) },
  { method: 'get', route: '/api/students/{studentId}/results', path: () => `/api/students/${resc.foreignStudentId}/results`, expect: { ...resultReaders(404), admin: 200 } },
  // No result exists in a freshly seeded school yet: not there for anyone allowed to ask.
  { method: 'get', route: '/api/results/{id}', path: () => `/api/results/${randomUUID()}`, expect: resultReaders(404) },
  { method: 'get', route: '/api/results/{id}/report', path: () => `/api/results/${randomUUID()}/report`, expect: resultReaders(404) },
];

// ---- Results pages, exports and printable reports (issue 8) ------------------------------------
// Minors' results go only to those who need them: admins and a sitting's planner see every row, a
// teacher their own pupils' (another teacher's sitting or class answers 404), an examiner the slots
// they marked once marking has closed; a student reads only their own released take-home report.
interface ReportCtx {
  /** Planned by an admin, with one candidate the demo teacher does not teach. */
  othersSittingId: string;
  /** The demo student's results from the seeded year (demo-year.ts): released, and one not yet released. */
  releasedMarkedBy: string;
  releasedNotMarkedBy: string;
  unreleased: string;
}
const repc = {} as ReportCtx;
const staffOnly = (ok: number, otherOrg = 404): Record<Caller, number> => ({ none: 401, admin: ok, teacher: ok, examiner: 403, student: 403, otherOrgAdmin: otherOrg });
const NO_RESULT = '00000000-0000-4000-8000-0000000000aa';

async function prepareReports(): Promise<void> {
  const admin = { Authorization: `Bearer ${await tokenFor(EMAIL.admin)}` };
  const ok = <T>(res: { status: number; body: T; text: string }, status: number): T => {
    if (res.status !== status) throw new Error(`setup: expected ${status}, got ${res.status} ${res.text}`);
    return res.body;
  };
  const s = ok(await api().post('/api/sittings').set(admin).send(sittingDay('2030-03-04', 'Matrix R', { papers: [{ listVersionId: sc.g3 }] })), 201) as { id: string };
  ok(await api().post(`/api/sittings/${s.id}/candidates`).set(admin).send({ studentIds: [tc.otherStudentId] }), 200);
  repc.othersSittingId = s.id;
  // Ellis's results, and whether the demo examiner (Priya) is on each sitting's panel: an examiner
  // reads a mark sheet only of a slot they marked.
  const ellis = (ok(await api().get('/api/students?search=KL1021').set(admin), 200) as { id: string }[])[0]!.id;
  const results = ok(await api().get(`/api/students/${ellis}/results`).set(admin), 200) as { id: string; sittingId: string; releasedAt: string | null }[];
  const priyaMarked = async (sittingId: string) => {
    type Ref = { displayName: string } | null;
    const v = ok(await api().get(`/api/sittings/${sittingId}`).set(admin), 200) as { slots: { studentId: string; examiner: Ref; secondExaminer: Ref }[] };
    const slot = v.slots.find((x) => x.studentId === ellis)!;
    return [slot.examiner, slot.secondExaminer].some((e) => e?.displayName === 'Priya Halvorsen');
  };
  const released = results.filter((r) => r.releasedAt !== null);
  const marked = await Promise.all(released.map((r) => priyaMarked(r.sittingId)));
  repc.releasedMarkedBy = released.find((_, i) => marked[i])!.id;
  repc.releasedNotMarkedBy = released.find((_, i) => !marked[i])!.id;
  repc.unreleased = results.find((r) => r.releasedAt === null)!.id;
}

const REPORT_ROWS: Row[] = [
  // Today's sitting (the demo teacher planned it; marking still open, so no examiner sees results yet).
  { method: 'get', route: '/api/sittings/{id}/results', path: () => `/api/sittings/${sc.todayId}/results`, expect: { ...staffOnly(200), examiner: 404 } },
  { method: 'get', route: '/api/sittings/{id}/results', path: () => `/api/sittings/${repc.othersSittingId}/results`, expect: { ...staffOnly(200), teacher: 404, examiner: 404 } },
  { method: 'get', route: '/api/sittings/{id}/results/export', path: () => `/api/sittings/${sc.todayId}/results/export?bom=true`, expect: { ...staffOnly(200), examiner: 404 } },
  { method: 'get', route: '/api/sittings/{id}/results/export', path: () => `/api/sittings/${repc.othersSittingId}/results/export`, expect: { ...staffOnly(200), teacher: 404, examiner: 404 } },
  { method: 'get', route: '/api/classes/{id}/results', path: () => `/api/classes/${cc.ownClassId}/results`, expect: staffOnly(200) },
  { method: 'get', route: '/api/classes/{id}/results', path: () => `/api/classes/${cc.otherTeachersClassId}/results`, expect: { ...staffOnly(200), teacher: 404 } },
  { method: 'get', route: '/api/classes/{id}/results/export', path: () => `/api/classes/${cc.ownClassId}/results/export`, expect: staffOnly(200) },
  { method: 'get', route: '/api/classes/{id}/results/export', path: () => `/api/classes/${cc.otherTeachersClassId}/results/export?bom=true`, expect: { ...staffOnly(200), teacher: 404 } },
  { method: 'get', route: '/api/classes/{id}/results/summary', path: () => `/api/classes/${cc.ownClassId}/results/summary`, expect: staffOnly(200) },
  { method: 'get', route: '/api/classes/{id}/results/summary', path: () => `/api/classes/${cc.otherTeachersClassId}/results/summary`, expect: { ...staffOnly(200), teacher: 404 } },
  // Each organisation compares and exports its own classes.
  { method: 'get', route: '/api/results/classes', path: () => '/api/results/classes', expect: staffOnly(200, 200) },
  { method: 'get', route: '/api/results/export', path: () => '/api/results/export?from=2026-09-01&to=2027-08-31', expect: adminOnly(200) },
  // A result that is not there (or not the caller's) answers 404; the mark sheet is for staff and examiners only.
  { method: 'get', route: '/api/results/{id}/mark-sheet', path: () => `/api/results/${NO_RESULT}/mark-sheet`, expect: { ...staffOnly(404), examiner: 404 } },
  { method: 'get', route: '/api/results/{id}/take-home', path: () => `/api/results/${NO_RESULT}/take-home`, expect: { ...staffOnly(404), student: 404 } },
  // Real results: the examiner reads the sheet of a slot they marked only; the student never the
  // examiner's sheet, but their own take-home report once released (not before).
  { method: 'get', route: '/api/results/{id}/mark-sheet', path: () => `/api/results/${repc.releasedMarkedBy}/mark-sheet`, expect: { ...staffOnly(200), examiner: 200 } },
  { method: 'get', route: '/api/results/{id}/mark-sheet', path: () => `/api/results/${repc.releasedNotMarkedBy}/mark-sheet`, expect: { ...staffOnly(200), examiner: 404 } },
  { method: 'get', route: '/api/results/{id}/take-home', path: () => `/api/results/${repc.releasedMarkedBy}/take-home`, expect: { ...staffOnly(200), student: 200 } },
  { method: 'get', route: '/api/results/{id}/take-home', path: () => `/api/results/${repc.unreleased}/take-home`, expect: { ...staffOnly(200), student: 404 } },
];

let seq = 0;
// ---- Progress and the attention list (issue 8) --------------------------------------------------
// A student's year: the student, their teachers, admins; another teacher's student and another
// organisation's 404; examiners are not a progress role (403). The attention list is for staff.
const PROGRESS_ROWS: Row[] = [
  { method: 'get', route: '/api/students/{studentId}/progress', path: () => `/api/students/${tc.ownStudentId}/progress`, expect: { none: 401, admin: 200, teacher: 200, examiner: 403, student: 200, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/students/{studentId}/progress', path: () => `/api/students/${tc.otherStudentId}/progress`, expect: { none: 401, admin: 200, teacher: 404, examiner: 403, student: 404, otherOrgAdmin: 404 } },
  { method: 'get', route: '/api/attention', path: () => '/api/attention', expect: { none: 401, admin: 200, teacher: 200, examiner: 403, student: 403, otherOrgAdmin: 200 } },
];

const ROWS: Row[] = [
  { method: 'get', route: '/api/health', path: () => '/api/health', expect: all(200) },
  // Public: the signed URL is the permission; a link that was not signed by us is refused for everyone.
  { method: 'get', route: '/api/media/{token}', path: () => '/api/media/bm90LXNpZ25lZA.bm90LXNpZ25lZA', expect: all(403) },
  { method: 'get', route: '/api/auth/me', path: () => '/api/auth/me', expect: members(200) },
  { method: 'patch', route: '/api/auth/me', path: () => '/api/auth/me', body: () => ({ noteNames: 'british' }), expect: members(200) },
  {
    method: 'post',
    route: '/api/auth/switch-organisation',
    path: () => '/api/auth/switch-organisation',
    body: (c) => ({ organisationId: c.otherOrgId }),
    // Only members of the other organisation may switch to it; its own admin is already there.
    expect: { ...members(404), otherOrgAdmin: 200 },
  },
  // Public by design: login answers 401 for wrong credentials whoever calls.
  { method: 'post', route: '/api/auth/login', path: () => '/api/auth/login', body: () => ({ email: 'nobody@demo.example', password: 'x' }), expect: all(401) },
  { method: 'post', route: '/api/auth/refresh', path: () => '/api/auth/refresh', expect: all(401) },
  { method: 'post', route: '/api/auth/logout', path: () => '/api/auth/logout', expect: all(204) },
  { method: 'get', route: '/api/today', path: () => '/api/today', expect: members(200) },
  { method: 'get', route: '/api/users', path: () => '/api/users', expect: adminOnly(200) },
  {
    method: 'post',
    route: '/api/users',
    path: () => '/api/users',
    body: (_c, caller) => ({ email: `matrix.${caller}.${Date.now()}.${seq++}@demo.example`, displayName: 'Matrix Person', roles: ['teacher'] }),
    expect: adminOnly(201),
  },
  {
    method: 'patch',
    route: '/api/users/{id}',
    path: (c) => `/api/users/${c.demoPersonId}`,
    body: () => ({ displayName: 'Idris Calloway' }),
    // Another organisation's admin must not learn that the person exists.
    expect: adminOnly(200, 404),
  },
  ...TEACHING_ROWS,
  ...CLASS_ROWS,
  ...SITTING_ROWS,
  ...MARKING_ROWS,
  ...AGREEMENT_ROWS,
  ...RECORDING_ROWS,
  ...RESULT_ROWS,
  ...REPORT_ROWS,
  ...PROGRESS_ROWS,
];

describe('role matrix', () => {
  const ctx = {} as Ctx;
  const seen: string[] = [];

  beforeAll(async () => {
    const admin = await tokenFor(EMAIL.admin);
    const list = await api().get('/api/users?search=calloway').set('Authorization', `Bearer ${admin}`);
    ctx.demoPersonId = list.body.items[0].id;
    const other = await tokenFor(EMAIL.otherOrgAdmin);
    const me = await api().get('/api/auth/me').set('Authorization', `Bearer ${other}`);
    ctx.otherOrgId = me.body.activeOrganisationId;
    await prepareClasses();
    await prepareTeaching();
    await prepareSittings();
    await prepareMarking();
    await prepareAgreement();
    await prepareRecordings();
    await prepareResults();
    await prepareReports();
    // Every feature's set-up runs here, over HTTP; on a loaded machine it outgrows the default 30 s.
  }, 120_000);

  for (const row of ROWS) {
    for (const caller of CALLERS) {
      it(`${row.method.toUpperCase()} ${row.route} as ${caller} → ${row.expect[caller]}`, async () => {
        let req = api()[row.method](row.path(ctx, caller));
        if (caller !== 'none') req = req.set('Authorization', `Bearer ${await tokenFor(EMAIL[caller])}`);
        if (row.body) req = req.send(row.body(ctx, caller));
        if (row.file) {
          const f = row.file();
          req = req.attach('file', f.content, { filename: f.name, contentType: 'application/json' });
        }
        const res = await req;
        // A binary body (the PDFs) has no text; the JSON and CSV answers are all scanned below.
        seen.push(typeof res.text === 'string' ? res.text : '');
        expect({ status: res.status, body: res.status >= 400 ? res.body : undefined }).toMatchObject({
          status: row.expect[caller],
        });
        if (res.status >= 400) {
          // One error shape everywhere (design.md §6).
          expect(res.body).toEqual(expect.objectContaining({ statusCode: res.status, error: expect.any(String), message: expect.any(String) }));
        }
      });
    }
  }

  it('no response in the matrix contains a password hash', () => {
    expect(seen.length).toBe(ROWS.length * CALLERS.length);
    for (const text of seen) expect(text).not.toMatch(/\$2[aby]\$\d\d\$/);
    for (const text of seen) expect(text).not.toMatch(/password_?hash/i);
  });

  it('the matrix covers every route in the OpenAPI document, and the document every route here', async () => {
    const doc = await api().get('/api/docs-json');
    expect(doc.status).toBe(200);
    const documented = Object.entries(doc.body.paths as Record<string, Record<string, unknown>>)
      .flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m} ${p}`))
      .sort();
    const inMatrix = [...new Set(ROWS.map((r) => `${r.method} ${r.route}`))].sort();
    expect(inMatrix).toEqual(documented);
  });
});
