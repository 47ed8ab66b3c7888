import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

describe('people admin', () => {
  let t: TestApp;
  let admin: string;
  const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

  beforeAll(async () => {
    t = await createTestApp();
    admin = await signIn(t, 'admin@demo.example');
  });
  afterAll(() => t.close());

  it('lists the organisation’s people with paging, search and sort', async () => {
    const page = await t.http().get('/api/users?pageSize=3&sort=email&order=asc').set(auth(admin));
    expect(page.status).toBe(200);
    expect(page.body.items).toHaveLength(3);
    expect(page.body.total).toBe(7); // 6 staff + the demo student in the demo school
    const emails = page.body.items.map((u: { email: string }) => u.email);
    expect(emails).toEqual([...emails].sort());
    const found = await t.http().get('/api/users?search=calloway').set(auth(admin));
    expect(found.body.items.map((u: { email: string }) => u.email)).toEqual(['teacher@demo.example']);
    // the other organisation's admin is not listed here
    const other = await t.http().get('/api/users?search=fernhill').set(auth(admin));
    expect(other.body.total).toBe(0);
  });

  it('refuses bad query values with a message naming the field', async () => {
    const res = await t.http().get('/api/users?pageSize=1000').set(auth(admin));
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('pageSize');
  });

  it('creates a person, refuses the same e-mail twice, and never returns a hash', async () => {
    const body = { email: 'new.teacher@demo.example', displayName: 'Nadia Fenwick', roles: ['teacher'], password: 'a-long-enough-password' };
    const res = await t.http().post('/api/users').set(auth(admin)).send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'new.teacher@demo.example', roles: ['teacher'], active: true });
    expect(JSON.stringify(res.body)).not.toMatch(/password|\$2[aby]\$/i);
    const again = await t.http().post('/api/users').set(auth(admin)).send(body);
    expect(again.status).toBe(409);
    expect(await signIn(t, 'new.teacher@demo.example', 'a-long-enough-password')).toMatch(/^ey/);
  });

  it('a person added without a password is sent an invitation after commit', async () => {
    const res = await t.http().post('/api/users').set(auth(admin)).send({ email: 'invited.examiner@demo.example', displayName: 'Ines Fairlie', roles: ['examiner'] });
    expect(res.status).toBe(201);
    const mail = await t.db.query(`SELECT kind, to_address, account_token_id FROM outbound_mail WHERE to_address = 'invited.examiner@demo.example'`);
    expect(mail).toHaveLength(1);
    expect(mail[0]).toMatchObject({ kind: 'invitation' });
    expect(mail[0].account_token_id).toBeTruthy();
    // someone who already has a sign-in at another school is added without a new invitation
    const fernhill = await signIn(t, 'admin@fernhill.example');
    const elsewhere = await t.http().post('/api/users').set(auth(fernhill)).send({ email: 'two.schools@fernhill.example', displayName: 'Una Brady', roles: ['teacher'], password: 'a-long-enough-password' });
    expect(elsewhere.status).toBe(201);
    const again = await t.http().post('/api/users').set(auth(admin)).send({ email: 'two.schools@fernhill.example', displayName: 'Una Brady', roles: ['examiner'] });
    expect(again.status).toBe(201);
    const none = await t.db.query(`SELECT 1 FROM outbound_mail WHERE to_address = 'two.schools@fernhill.example'`);
    expect(none).toHaveLength(0);
  });

  it('refuses a short password and an unknown role', async () => {
    const short = await t.http().post('/api/users').set(auth(admin)).send({ email: 'x@demo.example', displayName: 'X', roles: ['teacher'], password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.details[0]).toMatchObject({ path: 'password' });
    const role = await t.http().post('/api/users').set(auth(admin)).send({ email: 'x@demo.example', displayName: 'X', roles: ['owner'] });
    expect(role.status).toBe(400);
  });

  it('deactivating a person stops their existing token at once and their sign-in', async () => {
    const token = await signIn(t, 'tomasz.whitcombe@demo.example');
    expect((await t.http().get('/api/today').set(auth(token))).status).toBe(200);
    const list = await t.http().get('/api/users?search=whitcombe').set(auth(admin));
    const id = list.body.items[0].id as string;
    const res = await t.http().patch(`/api/users/${id}`).set(auth(admin)).send({ active: false });
    expect(res.status).toBe(200);
    expect(res.body.active).toBe(false);
    expect((await t.http().get('/api/today').set(auth(token))).status).toBe(401);
    const again = await t.http().post('/api/auth/login').send({ email: 'tomasz.whitcombe@demo.example', password: 'stavemark-demo' });
    expect(again.status).toBe(401);
    // reactivate: a fresh sign-in works again
    await t.http().patch(`/api/users/${id}`).set(auth(admin)).send({ active: true });
    expect(await signIn(t, 'tomasz.whitcombe@demo.example')).toMatch(/^ey/);
  });

  it('a person of another organisation answers 404, a non-UUID 400', async () => {
    const fernhillAdmin = await signIn(t, 'admin@fernhill.example');
    const theirs = await t.http().get('/api/users').set(auth(fernhillAdmin));
    const declan = theirs.body.items.find((u: { email: string }) => u.email === 'admin@fernhill.example');
    const res = await t.http().patch(`/api/users/${declan.id}`).set(auth(admin)).send({ roles: ['teacher'] });
    expect(res.status).toBe(404);
    expect(res.body).toMatchObject({ statusCode: 404, error: 'Not Found' });
    expect((await t.http().patch('/api/users/not-an-id').set(auth(admin)).send({ roles: ['teacher'] })).status).toBe(400);
  });

  it('an admin cannot lock themselves out', async () => {
    const me = await t.http().get('/api/auth/me').set(auth(admin));
    const res = await t.http().patch(`/api/users/${me.body.id}`).set(auth(admin)).send({ active: false });
    expect(res.status).toBe(409);
  });

  it('changes are audited with before and after', async () => {
    const rows = await t.db.query(`SELECT action, before, after FROM audit_events WHERE action = 'member.updated' ORDER BY at`);
    expect(rows.length).toBeGreaterThan(0);
    expect(rows[0].before.active).toBe(true);
    expect(rows[0].after.active).toBe(false);
  });

  it('teachers and students get 403', async () => {
    const teacher = await signIn(t, 'teacher@demo.example');
    expect((await t.http().get('/api/users').set(auth(teacher))).status).toBe(403);
    const student = await signIn(t, 'student@demo.example');
    expect((await t.http().get('/api/users').set(auth(student))).status).toBe(403);
  });
});
