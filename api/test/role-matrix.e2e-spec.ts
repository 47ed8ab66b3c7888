import { randomUUID } from 'node:crypto';
import { api, tokenFor } from './e2e-support/api';

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
  method: 'get' | 'post' | 'patch' | 'delete';
  /** OpenAPI path, e.g. /api/users/{id} */
  route: string;
  path: (c: Ctx) => string;
  body?: (c: Ctx, caller: Caller) => object;
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

let seq = 0;
const ROWS: Row[] = [
  { method: 'get', route: '/api/health', path: () => '/api/health', expect: all(200) },
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
  ...MARKING_ROWS,
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
    await prepareMarking();
  });

  for (const row of ROWS) {
    for (const caller of CALLERS) {
      it(`${row.method.toUpperCase()} ${row.route} as ${caller} → ${row.expect[caller]}`, async () => {
        let req = api()[row.method](row.path(ctx));
        if (caller !== 'none') req = req.set('Authorization', `Bearer ${await tokenFor(EMAIL[caller])}`);
        if (row.body) req = req.send(row.body(ctx, caller));
        const res = await req;
        seen.push(res.text);
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
