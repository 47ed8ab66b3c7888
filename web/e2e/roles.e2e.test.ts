import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Role } from '@stavemark/shared';
import { navItemsFor } from '@/app/navigation';
import { launch, screenshot, type Session } from './support/browser';
import { DEMO, mainNavLinks, navLink, signIn } from './support/sign-in';

// Only an administrator may manage people (design.md §2); every role has Today.
const seesPeople: Record<Role, boolean> = {
  admin: true,
  teacher: false,
  examiner: false,
  student: false,
};

// The section headings Today shows for each role (features/today/components).
const expectedSection: Record<Role, string> = {
  admin: 'The organisation',
  teacher: 'Your classes',
  examiner: 'Your sittings today',
  student: 'Your lessons',
};

describe('each demo role signs in and sees its own navigation', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close(); // s is unset when launch itself failed
  });

  it.each(Object.keys(DEMO) as Role[])('%s', async (role) => {
    const session = await signIn(s.page, DEMO[role]);
    const active = session.user.memberships.find(
      (m) => m.organisationId === session.user.activeOrganisationId,
    );
    expect(active?.roles).toContain(role);

    const links = await mainNavLinks(s.page);
    // Exactly the rows of the navigation table for the roles held here, in order.
    expect(links).toEqual(navItemsFor(active?.roles ?? []).map((item) => item.label));
    expect(links[0]).toBe('Today');
    expect(links.includes('People')).toBe(seesPeople[role]);
    await s.page.getByRole('heading', { name: expectedSection[role], level: 2 }).waitFor();
    // The signed-in person and their organisation are shown in the bar.
    const banner = s.page.getByRole('banner');
    expect(await banner.textContent()).toContain(session.user.displayName);
    expect(await banner.textContent()).toContain(active?.organisationName ?? '(no organisation)');

    await screenshot(s.page, `today-${role}`);

    if (role === 'admin') {
      await navLink(s.page, 'People').click();
      await s.page.getByRole('heading', { name: 'People', level: 1 }).waitFor();
      // The first page lists somebody; a search finds the demo teacher wherever they sort.
      await s.page.getByRole('cell', { name: /@/ }).first().waitFor();
      await screenshot(s.page, 'people-admin');
      await s.page.getByLabel('Search').fill(DEMO.teacher);
      await s.page.getByRole('cell', { name: DEMO.teacher, exact: true }).waitFor();
      // The search is debounced and answered by the server: wait for the list to narrow.
      const rows = s.page.getByRole('table').getByRole('row');
      await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(2); // header + the one match
    } else {
      // Typing the address does not open a page that is not for this role.
      await s.page.goto(new URL('/people', s.page.url()).toString());
      await s.page.getByRole('heading', { name: 'Not open to your role' }).waitFor();
    }
    expect(s.problems).toEqual([]);
  });
});
