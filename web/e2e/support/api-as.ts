import { BASE_URL } from './browser';
import { DEMO_PASSWORD } from './sign-in';

/**
 * The API as one demo person, outside the page: for setting up what a journey needs. Signs in
 * once and renews through the refresh cookie, as the web client does (the browser suite's access
 * tokens live 5 s, and sign-in is rate-limited).
 */
export class ApiAs {
  private token = '';
  private cookie = '';
  private expiresAt = 0;

  constructor(readonly email: string) {}

  private async renew(): Promise<void> {
    if (this.cookie) {
      const r = await fetch(`${BASE_URL}/api/auth/refresh`, { method: 'POST', headers: { Cookie: this.cookie } });
      if (r.ok) return this.take(r);
    }
    const r = await fetch(`${BASE_URL}/api/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: this.email, password: DEMO_PASSWORD }),
    });
    if (!r.ok) throw new Error(`sign-in as ${this.email}: ${r.status} ${await r.text()}`);
    await this.take(r);
  }

  private async take(r: Response): Promise<void> {
    const body = (await r.json()) as { accessToken: string; expiresIn: number };
    const set = r.headers.getSetCookie().find((c) => c.startsWith('stavemark_refresh='));
    if (set) this.cookie = set.split(';')[0]!;
    this.token = body.accessToken;
    this.expiresAt = Date.now() + (body.expiresIn - 1) * 1000;
  }

  /** Answers the JSON body; anything but `expect` throws with the API's message. */
  async call<T>(method: string, path: string, body?: unknown, expect = method === 'POST' && /\/(sittings|exercises)$/.test(path) ? 201 : 200): Promise<T> {
    if (Date.now() >= this.expiresAt) await this.renew();
    const r = await fetch(`${BASE_URL}/api${path}`, {
      method,
      headers: { Authorization: `Bearer ${this.token}`, ...(body === undefined ? {} : { 'Content-Type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await r.text();
    if (r.status !== expect) throw new Error(`${method} ${path} as ${this.email}: expected ${expect}, got ${r.status} ${text}`);
    return (text ? JSON.parse(text) : undefined) as T;
  }
}
