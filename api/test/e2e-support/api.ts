import request from 'supertest';

export const API_URL = process.env.API_URL ?? 'http://127.0.0.1:3100';
export const DEMO_PASSWORD = 'stavemark-demo';

export const api = (): request.Agent => request.agent(API_URL);

const tokens = new Map<string, string>();

/** Signs in once per e-mail per test file (sign-in is rate-limited, like in production). */
export async function tokenFor(email: string): Promise<string> {
  const cached = tokens.get(email);
  if (cached) return cached;
  const res = await api().post('/api/auth/login').send({ email, password: DEMO_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in as ${email}: ${res.status} ${JSON.stringify(res.body)}`);
  const token = (res.body as { accessToken: string }).accessToken;
  tokens.set(email, token);
  return token;
}
