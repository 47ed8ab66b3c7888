import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Role } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser, ORG_ID, OTHER_ORG_ID } from '@/test/factories';
import { navEntriesFor, navItemsFor } from './navigation';

function todayFor(roles: Role[]) {
  return {
    date: '2026-12-01',
    timeZone: 'Europe/London',
    organisationName: 'Larkfield Music School',
    roles,
    ...(roles.includes('admin')
      ? { admin: { people: 48, students: 40, classes: 4, term: null } }
      : {}),
    ...(roles.includes('teacher') ? { teacher: { classes: [] } } : {}),
    ...(roles.includes('examiner') ? { examiner: { sittings: [] } } : {}),
    ...(roles.includes('student')
      ? { student: { name: 'Rowan Hale', grade: 3, classes: [] } }
      : {}),
  };
}

function navLinks() {
  const nav = screen.getByRole('navigation', { name: 'Main' });
  // Those inside the bar's closed menus too, in order.
  return within(nav)
    .getAllByRole('link', { hidden: true })
    .map((a) => a.textContent);
}

describe('navigation per role', () => {
  // Only an administrator manages people (design.md §2); every role's home is Today. Later
  // features add rows to the table, so the rest of each list is read from the table itself.
  it.each<[Role, boolean]>([
    ['admin', true],
    ['teacher', false],
    ['examiner', false],
    ['student', false],
  ])('%s: Today first, People shown = %s, exactly the rows of the table', async (role, people) => {
    mockApi({ 'GET /api/today': () => json(200, todayFor([role])) });
    renderApp('/', makeSession(makeUser([role])));
    expect(await screen.findByRole('heading', { name: 'Today' })).toBeInTheDocument();
    const links = navLinks();
    expect(links[0]).toBe('Today');
    expect(links.includes('People')).toBe(people);
    expect(links).toEqual(navItemsFor([role]).map((i) => i.label));
  });

  it('groups the administrator\'s rarer pages into menus of the bar that open, close on Escape and read as current', async () => {
    mockApi({ 'GET /api/today': () => json(200, todayFor(['admin'])) });
    renderApp('/', makeSession(makeUser(['admin'])));
    await screen.findByRole('heading', { name: 'Today' });
    const nav = screen.getByRole('navigation', { name: 'Main' });
    const menus = within(nav).getAllByRole('button').map((b) => b.textContent);
    expect(menus).toEqual(['Syllabus', 'Marking quality', 'School']);
    // Closed, a menu's links are out of the way (and of the accessibility tree).
    expect(within(nav).queryByRole('link', { name: 'Outbox' })).toBeNull();
    const user = userEvent.setup();
    const school = within(nav).getByRole('button', { name: 'School' });
    await user.click(school);
    expect(school).toHaveAttribute('aria-expanded', 'true');
    expect(within(nav).getByRole('link', { name: 'Outbox' })).toBeVisible();
    await user.keyboard('{Escape}');
    expect(school).toHaveAttribute('aria-expanded', 'false');
    expect(school).toHaveFocus();
    await user.click(school);
    await user.click(within(nav).getByRole('link', { name: 'Recordings' }));
    expect(school).toHaveAttribute('aria-expanded', 'false');
    // Current once the page has loaded (the routes load lazily).
    await waitFor(() => expect(school).toHaveClass('active'));
  });

  it('shows a menu with one page for the role as that page\'s link, and no menu for a student', () => {
    const kinds = (roles: Role[]) => navEntriesFor(roles).map((e) => (e.kind === 'group' ? `[${e.label}]` : e.item.label));
    expect(kinds(['student'])).toEqual(navItemsFor(['student']).map((i) => i.label));
    expect(kinds(['examiner'])).toContain('[Marking quality]');
    // Every page of the table is reachable: each item is a link or inside exactly one menu.
    for (const role of ['admin', 'teacher', 'examiner', 'student'] as Role[]) {
      const flat = navEntriesFor([role]).flatMap((e) => (e.kind === 'group' ? e.items : [e.item]));
      expect(flat).toEqual(navItemsFor([role]));
    }
  });

  it('offers People whenever admin is among the roles', () => {
    expect(navItemsFor(['teacher']).map((i) => i.label)).not.toContain('People');
    expect(navItemsFor(['teacher', 'admin']).map((i) => i.label)).toContain('People');
  });

  it('shows who is signed in, the organisation and the roles', async () => {
    mockApi({ 'GET /api/today': () => json(200, todayFor(['teacher', 'examiner'])) });
    renderApp('/', makeSession(makeUser(['teacher', 'examiner'])));
    await screen.findByRole('heading', { name: 'Today' });
    const banner = screen.getByRole('banner');
    expect(within(banner).getByText('Rowan Hale')).toBeInTheDocument();
    expect(within(banner).getByText('Larkfield Music School')).toBeInTheDocument();
    expect(within(banner).getByText('Teacher, Examiner')).toBeInTheDocument();
  });

  it('a teacher who opens the People address is told it is not for their role', async () => {
    const api = mockApi({});
    renderApp('/people', makeSession(makeUser(['teacher'])));
    expect(
      await screen.findByRole('heading', { name: 'Not open to your role' }),
    ).toBeInTheDocument();
    expect(api.calls('GET /api/users')).toHaveLength(0);
  });

  it('an unknown address shows the not-found page inside the layout', async () => {
    mockApi({});
    renderApp('/no-such-page', makeSession(makeUser(['student'])));
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeInTheDocument();
    expect(screen.getByText('/no-such-page')).toBeInTheDocument();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeInTheDocument();
  });

  it('a person in two organisations can switch; the roles of the new one count', async () => {
    const twoOrgs = makeUser(['teacher'], {
      memberships: [
        {
          organisationId: ORG_ID,
          organisationName: 'Larkfield Music School',
          timeZone: 'Europe/London',
          roles: ['teacher'],
        },
        {
          organisationId: OTHER_ORG_ID,
          organisationName: 'Harbour Piano Studio',
          timeZone: 'Europe/Dublin',
          roles: ['admin'],
        },
      ],
    });
    const api = mockApi({
      'GET /api/today': (req) =>
        json(
          200,
          req.headers.get('Authorization') === 'Bearer token-2'
            ? todayFor(['admin'])
            : todayFor(['teacher']),
        ),
      'POST /api/auth/switch-organisation': () =>
        json(200, makeSession({ ...twoOrgs, activeOrganisationId: OTHER_ORG_ID }, 'token-2')),
    });
    renderApp('/', makeSession(twoOrgs));
    await screen.findByRole('heading', { name: 'Today' });
    expect(navLinks()).not.toContain('People');

    const user = userEvent.setup();
    // PrimeReact's Dropdown opens on a click on its visible box.
    const switcher = screen.getByLabelText('Organisation').closest('.p-dropdown');
    await user.click(switcher as HTMLElement);
    // jsdom has no layout, so PrimeReact's overlay positioning leaves the panel display:none;
    // in a browser it is visible (the e2e tests use real panels).
    await user.click(
      await screen.findByRole('option', { name: 'Harbour Piano Studio', hidden: true }),
    );

    expect(await screen.findByRole('link', { name: 'People' })).toBeInTheDocument();
    expect(api.calls('POST /api/auth/switch-organisation')[0]?.body).toEqual({
      organisationId: OTHER_ORG_ID,
    });
    // Today is fetched again with the new organisation's token and shows its sections.
    expect(await screen.findByRole('region', { name: 'The organisation' })).toBeInTheDocument();
    expect(api.calls('GET /api/today').at(-1)?.headers.get('Authorization')).toBe('Bearer token-2');
    expect(within(screen.getByRole('banner')).getByText('Administrator')).toBeInTheDocument();
  });

  it('sign out tells the server, forgets the session and shows the sign-in page', async () => {
    const api = mockApi({
      'GET /api/today': () => json(200, todayFor(['student'])),
      'POST /api/auth/logout': () => new Response(null, { status: 204 }),
    });
    renderApp('/', makeSession(makeUser(['student'])));
    await screen.findByRole('heading', { name: 'Today' });
    await userEvent.setup().click(screen.getByRole('button', { name: 'Sign out' }));
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(screen.getByText('You have signed out.')).toBeInTheDocument();
    expect(api.calls('POST /api/auth/logout')).toHaveLength(1);
  });
});
