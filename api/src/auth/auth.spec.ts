import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

const REFRESH = 'stavemark_refresh';

function refreshCookie(setCookie: string[] | string | undefined): string {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const c = list.find((x) => x.startsWith(`${REFRESH}=`));
  if (!c) throw new Error('no refresh cookie set');
  return c.split(';')[0]!;
}

describe('sign-in, refresh rotation and revocation', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ env: { ACCESS_TOKEN_TTL_SECONDS: '900', LOGIN_LIMIT_PER_EMAIL: '5' } });
  });
  afterAll(() => t.close());

  it('signs in and returns the person with memberships, no password hash', async () => {
    const res = await t.http().post('/api/auth/login').send({ email: 'Teacher@Demo.Example ', password: 'stavemark-demo' });
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe('teacher@demo.example');
    expect(res.body.user.memberships[0].roles).toEqual(['teacher']);
    expect(res.body.accessToken).toMatch(/^ey/);
    expect(JSON.stringify(res.body)).not.toMatch(/\$2[aby]\$/);
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith(REFRESH));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
    expect(cookie).toMatch(/Path=\/api\/auth/);
  });

  it('a wrong password gets 401 with a message that does not say which part was wrong', async () => {
    const res = await t.http().post('/api/auth/login').send({ email: 'teacher@demo.example', password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ statusCode: 401, error: 'Unauthorized', message: 'The e-mail address or password is not right.' });
    const unknown = await t.http().post('/api/auth/login').send({ email: 'nobody@demo.example', password: 'not-the-password' });
    expect(unknown.body.message).toBe(res.body.message);
  });

  it('unknown fields and a bad e-mail are refused with details', async () => {
    const res = await t.http().post('/api/auth/login').send({ email: 'x', password: 'y', admin: true });
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['email', '(body)']));
  });

  it('repeated attempts for one e-mail end in 429 with Retry-After', async () => {
    const statuses: number[] = [];
    let retryAfter: string | undefined;
    for (let i = 0; i < 7; i++) {
      const r = await t.http().post('/api/auth/login').send({ email: 'examiner@demo.example', password: 'wrong-wrong-wrong' });
      statuses.push(r.status);
      if (r.status === 429) retryAfter = r.headers['retry-after'];
    }
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses.at(-1)).toBe(429);
    expect(Number(retryAfter)).toBeGreaterThan(0);
  });

  it('refresh rotates the cookie; a reused refresh token revokes the family', async () => {
    const login = await t.http().post('/api/auth/login').send({ email: 'admin@demo.example', password: 'stavemark-demo' });
    const first = refreshCookie(login.headers['set-cookie']);
    const r1 = await t.http().post('/api/auth/refresh').set('Cookie', first);
    expect(r1.status).toBe(200);
    const second = refreshCookie(r1.headers['set-cookie']);
    expect(second).not.toBe(first);
    // The first token again: a copy is in use, so the whole family goes.
    expect((await t.http().post('/api/auth/refresh').set('Cookie', first)).status).toBe(401);
    expect((await t.http().post('/api/auth/refresh').set('Cookie', second)).status).toBe(401);
  });

  it('logout revokes the refresh token', async () => {
    const login = await t.http().post('/api/auth/login').send({ email: 'admin@demo.example', password: 'stavemark-demo' });
    const cookie = refreshCookie(login.headers['set-cookie']);
    expect((await t.http().post('/api/auth/logout').set('Cookie', cookie)).status).toBe(204);
    expect((await t.http().post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(401);
  });

  it('me answers for a valid token, 401 without one or with a forged one', async () => {
    const token = await signIn(t, 'student@demo.example');
    const me = await t.http().get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(me.status).toBe(200);
    expect(me.body.memberships[0].roles).toEqual(['student']);
    expect((await t.http().get('/api/auth/me')).status).toBe(401);
    expect((await t.http().get('/api/auth/me').set('Authorization', `Bearer ${token}x`)).status).toBe(401);
  });

  it('an access token is checked against the database on every request: version, membership, roles', async () => {
    const token = await signIn(t, 'ottilie.brandt@demo.example');
    const auth = { Authorization: `Bearer ${token}` };
    const [row] = (await t.db.query(
      `SELECT p.id, m.roles FROM people p JOIN memberships m ON m.person_id = p.id WHERE p.email = 'ottilie.brandt@demo.example'`,
    )) as { id: string; roles: string[] }[];
    const { id: personId, roles } = row!;
    expect((await t.http().get('/api/marking/today').set(auth)).status).toBe(200);
    // A role taken away counts on the next request (403 now, not at the token's expiry).
    await t.db.query(`UPDATE memberships SET roles = ARRAY['teacher'] WHERE person_id = $1`, [personId]);
    expect((await t.http().get('/api/marking/today').set(auth)).status).toBe(403);
    await t.db.query(`UPDATE memberships SET roles = $2 WHERE person_id = $1`, [personId, roles]);
    expect((await t.http().get('/api/marking/today').set(auth)).status).toBe(200);
    // An inactive membership, then a bumped token version, each refuse the same token at once.
    await t.db.query(`UPDATE memberships SET active = false WHERE person_id = $1`, [personId]);
    expect((await t.http().get('/api/auth/me').set(auth)).status).toBe(401);
    await t.db.query(`UPDATE memberships SET active = true WHERE person_id = $1`, [personId]);
    expect((await t.http().get('/api/auth/me').set(auth)).status).toBe(200);
    await t.db.query(`UPDATE people SET token_version = token_version + 1 WHERE id = $1`, [personId]);
    expect((await t.http().get('/api/auth/me').set(auth)).status).toBe(401);
  });

  it('a person in two organisations can switch; the token is scoped to the chosen one', async () => {
    const login = await t.http().post('/api/auth/login').send({ email: 'beatrix.oduya@demo.example', password: 'stavemark-demo' });
    expect(login.body.user.memberships).toHaveLength(2);
    const other = login.body.user.memberships.find((m: { organisationId: string }) => m.organisationId !== login.body.user.activeOrganisationId);
    const sw = await t.http().post('/api/auth/switch-organisation').set('Authorization', `Bearer ${login.body.accessToken}`).send({ organisationId: other.organisationId });
    expect(sw.status).toBe(200);
    expect(sw.body.user.activeOrganisationId).toBe(other.organisationId);
    const today = await t.http().get('/api/today').set('Authorization', `Bearer ${sw.body.accessToken}`);
    expect(today.body.organisationName).toBe('Fernhill Piano Studio');
  });

  it('changing note-value names is kept per person', async () => {
    const token = await signIn(t, 'ottilie.brandt@demo.example');
    const res = await t.http().patch('/api/auth/me').set('Authorization', `Bearer ${token}`).send({ noteNames: 'american' });
    expect(res.status).toBe(200);
    expect(res.body.noteNames).toBe('american');
  });
});
