import request from 'supertest';

export const API_URL = process.env.API_URL ?? 'http://127.0.0.1:3100';
export const DEMO_PASSWORD = 'stavemark-demo';

export const api = (): request.Agent => request.agent(API_URL);

interface Session {
  accessToken: string;
  cookie: string;
  expiresAt: number;
}

const sessions = new Map<string, Session>();

function sessionFrom(res: request.Response): Session {
  const body = res.body as { accessToken: string; expiresIn: number };
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const cookie = cookies.find((c) => c.startsWith('stavemark_refresh='))?.split(';')[0] ?? '';
  // Renew a second early so a request never races the expiry.
  return { accessToken: body.accessToken, cookie, expiresAt: Date.now() + (body.expiresIn - 1) * 1000 };
}

/**
 * An access token for a demo person. Signs in once per e-mail per test file (sign-in is
 * rate-limited, as in production) and renews through the refresh cookie when the short-lived
 * token of the test server is about to expire — as the web client does.
 */
export async function tokenFor(email: string): Promise<string> {
  const current = sessions.get(email);
  if (current && Date.now() < current.expiresAt) return current.accessToken;
  if (current?.cookie) {
    const res = await api().post('/api/auth/refresh').set('Cookie', current.cookie);
    if (res.status === 200) {
      const next = sessionFrom(res);
      sessions.set(email, next);
      return next.accessToken;
    }
  }
  const res = await api().post('/api/auth/login').send({ email, password: DEMO_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in as ${email}: ${res.status} ${JSON.stringify(res.body)}`);
  const next = sessionFrom(res);
  sessions.set(email, next);
  return next.accessToken;
}
