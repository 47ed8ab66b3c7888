import { api } from './e2e-support/api';

describe('sign-in over HTTP', () => {
  it('repeated wrong passwords end in 429 with Retry-After', async () => {
    const email = `rate.${Date.now()}@demo.example`;
    const statuses: number[] = [];
    let retryAfter: string | undefined;
    for (let i = 0; i < 12; i++) {
      const res = await api().post('/api/auth/login').send({ email, password: 'definitely-wrong' });
      statuses.push(res.status);
      if (res.status === 429) retryAfter = res.headers['retry-after'];
    }
    expect(statuses[0]).toBe(401);
    expect(statuses).toContain(429);
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
