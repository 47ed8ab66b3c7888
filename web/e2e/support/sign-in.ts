import type { Page } from 'playwright-core';
import type { AuthSession, Role } from '@stavemark/shared';
import { BASE_URL } from './browser';

export const DEMO_PASSWORD = 'stavemark-demo';

/** The demo school's sign-ins (seed-data), one per role. */
export const DEMO: Record<Role, string> = {
  admin: 'admin@demo.example',
  teacher: 'teacher@demo.example',
  examiner: 'examiner@demo.example',
  student: 'student@demo.example',
};

export async function fillSignIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto(`${BASE_URL}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Signs in through the form and waits for Today; returns the session the API answered. */
export async function signIn(
  page: Page,
  email: string,
  password = DEMO_PASSWORD,
): Promise<AuthSession> {
  // Together, so a failed page load does not leave the wait for the answer dangling.
  const [response] = await Promise.all([
    page.waitForResponse(
      (r) => r.url().endsWith('/api/auth/login') && r.request().method() === 'POST',
    ),
    fillSignIn(page, email, password),
  ]);
  if (response.status() !== 200) {
    throw new Error(`Sign-in as ${email} answered ${response.status()}: ${await response.text()}`);
  }
  await page.getByRole('heading', { name: 'Today', level: 1 }).waitFor();
  return (await response.json()) as AuthSession;
}

/** Every link of the main navigation bar, those inside its closed menus too, in order. */
export async function mainNavLinks(page: Page): Promise<string[]> {
  const links = page.getByRole('navigation', { name: 'Main' }).getByRole('link', { includeHidden: true });
  return (await links.allTextContents()).map((t) => t.trim());
}

/**
 * A link of the main navigation bar (pages may link to the same place in other words). `click`
 * first opens the bar's menu that holds it, as a person would.
 */
export function navLink(page: Page, label: string) {
  const nav = page.getByRole('navigation', { name: 'Main' });
  const link = nav.getByRole('link', { name: label, exact: true, includeHidden: true });
  return {
    link,
    async click() {
      // `has` is matched inside each menu, so it takes a locator from the page, not from `nav`.
      const group = nav.locator('li.sm-bar-group').filter({ has: page.getByRole('link', { name: label, exact: true, includeHidden: true }) });
      if ((await group.count()) > 0 && !(await link.isVisible())) await group.getByRole('button').click();
      await link.click();
    },
  };
}
