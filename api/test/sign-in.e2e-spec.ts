import { api } from './e2e-support/api';

describe('sign-in over HTTP', () => {
  it('repeated wrong passwords end in 429 with Retry-After', async () => {
    const email = `rate.${Date.now()}@demo.example`;
    const statuses: number[] = [];
    let retryAfter: string | undefined;
    // The server's per-e-mail limit (LOGIN_LIMIT_PER_EMAIL, 30 on the test server) ends it.
    const limit = Number(process.env.LOGIN_LIMIT_PER_EMAIL ?? 8);
    for (let i = 0; i <= limit + 1; i++) {
      const res = await api().post('/api/auth/login').send({ email, password: 'definitely-wrong' });
      statuses.push(res.status);
      if (res.status === 429) retryAfter = res.headers['retry-after'];
    }
    expect(statuses[0]).toBe(401);
    expect(statuses.slice(0, limit)).toEqual(Array(limit).fill(401));
    expect(statuses.at(-1)).toBe(429);
    expect(Number(retryAfter)).toBeGreaterThan(0);
  });

  it('the four demo sign-ins work', async () => {
    for (const role of ['admin', 'teacher', 'examiner', 'student']) {
      const res = await api().post('/api/auth/login').send({ email: `${role}@demo.example`, password: 'stavemark-demo' });
      expect(res.status).toBe(200);
      expect(res.body.user.memberships[0].roles).toContain(role);
    }
  });
});
