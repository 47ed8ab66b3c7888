import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { BASE_URL, launch, screenshot, type Session } from './support/browser';
import { DEMO, fillSignIn } from './support/sign-in';

describe('sign-in errors', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close(); // s is unset when launch itself failed
  });

  it('a wrong password shows the API message in an alert and stays on sign-in', async () => {
    const [response] = await Promise.all([
      s.page.waitForResponse((r) => r.url().endsWith('/api/auth/login')),
      fillSignIn(s.page, DEMO.teacher, 'not-the-password'),
    ]);
    expect(response.status()).toBe(401);
    const body = (await response.json()) as { message: string };

    const alert = s.page.getByRole('alert');
    await alert.waitFor();
    expect((await alert.textContent())?.trim()).toBe(body.message);
    // The message must not say which of the two was wrong (design.md §8).
    expect(body.message.toLowerCase()).toMatch(/e-?mail( address)? or password/);
    expect(s.page.url()).toBe(`${BASE_URL}/sign-in`);
    await screenshot(s.page, 'sign-in-wrong-password');
    expect(s.problems).toEqual([]);
  });

  it('an unknown page address, once signed out, leads to sign-in', async () => {
    await s.page.goto(`${BASE_URL}/no-such-page`);
    await s.page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(s.problems).toEqual([]);
  });
});
