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
  /** One renewal at a time: refresh tokens rotate, so two renewals with one cookie would clash. */
  private renewing: Promise<void> | null = null;

  constructor(readonly email: string) {}

  private renew(): Promise<void> {
    this.renewing ??= this.doRenew().finally(() => (this.renewing = null));
    return this.renewing;
  }

  private async doRenew(): Promise<void> {
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
    // Early, so a request never races the expiry (the browser suite's tokens live 5 s).
    this.expiresAt = Date.now() + (body.expiresIn - 2) * 1000;
  }

  /** Answers the JSON body; anything but `expect` throws with the API's message. */
  async call<T>(method: string, path: string, body?: unknown, expect = method === 'POST' && /\/(sittings|exercises)$/.test(path) ? 201 : 200): Promise<T> {
    if (Date.now() >= this.expiresAt) await this.renew();
    const send = () =>
      fetch(`${BASE_URL}/api${path}`, {
        method,
        headers: { Authorization: `Bearer ${this.token}`, ...(body === undefined ? {} : { 'Content-Type': 'application/json' }) },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
    let r = await send();
    // Expired on the way (a slow machine): renew once and send again, as the web client does.
    if (r.status === 401) {
      this.expiresAt = 0;
      await this.renew();
      r = await send();
    }
    const text = await r.text();
    if (r.status !== expect) throw new Error(`${method} ${path} as ${this.email}: expected ${expect}, got ${r.status} ${text}`);
    return (text ? JSON.parse(text) : undefined) as T;
  }
}
