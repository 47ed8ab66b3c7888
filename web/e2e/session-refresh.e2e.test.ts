import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { launch, type Session } from './support/browser';
import { DEMO, navLink, signIn } from './support/sign-in';

// The server for this run is started with a short access-token lifetime (ACCESS_TOKEN_TTL_SECONDS=5),
// so the test can outlive a token in seconds rather than the production quarter of an hour.
const envTtl = Number(process.env.ACCESS_TOKEN_TTL_SECONDS) || undefined;

describe('a signed-in page keeps working past the access token expiry', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close(); // s is unset when launch itself failed
  });

  it('renews the token silently and loads data without a trip to sign-in', async (ctx) => {
    const session = await signIn(s.page, DEMO.admin);
    if (envTtl !== undefined) expect(session.expiresIn).toBe(envTtl);
    const ttl = envTtl ?? session.expiresIn;
    if (ttl > 120) {
      ctx.skip(
        `the server's access token lives ${ttl} s; start it with ACCESS_TOKEN_TTL_SECONDS=5 to run this journey`,
      );
    }

    const refreshes: number[] = [];
    s.page.on('response', (r) => {
      if (r.url().endsWith('/api/auth/refresh')) refreshes.push(r.status());
    });

    await s.page.waitForTimeout((ttl + 2) * 1000);

    // Data through a client-side navigation: the expired token gets a 401, the client renews and retries.
    await navLink(s.page, 'People').click();
    await s.page.getByRole('cell', { name: /@/ }).first().waitFor(); // a row of people, from the API
    expect(new URL(s.page.url()).pathname).toBe('/people');
    expect(await s.page.getByRole('heading', { name: 'Sign in' }).count()).toBe(0);
    expect(refreshes).toContain(200);

    // Outlive the renewed token too, then reload: the session comes back from the refresh cookie.
    await s.page.waitForTimeout((ttl + 2) * 1000);
    await s.page.reload();
    await s.page.getByRole('cell', { name: /@/ }).first().waitFor(); // a row of people, from the API
    expect(new URL(s.page.url()).pathname).toBe('/people');

    // And back to Today, whose data also loads.
    await navLink(s.page, 'Today').click();
    await s.page.getByRole('heading', { name: 'The organisation', level: 2 }).waitFor();
    expect(refreshes.filter((status) => status !== 200)).toEqual([]);
    expect(s.problems).toEqual([]);
  });
});
