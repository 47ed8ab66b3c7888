import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { UserRow } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi, type RecordedRequest } from '@/test/fetch-mock';
import { makeSession, makeUser, makeUserRow } from '@/test/factories';

const me = makeUser(['admin']);
const people: UserRow[] = [
  makeUserRow({
    id: me.id,
    displayName: 'Rowan Hale',
    email: 'rowan.hale@school.example',
    roles: ['admin'],
  }),
  makeUserRow({
    displayName: 'Ada Quill',
    email: 'ada.quill@school.example',
    roles: ['teacher', 'examiner'],
  }),
  makeUserRow({
    displayName: 'Mira Osei',
    email: 'mira.osei@school.example',
    roles: ['student'],
    active: false,
  }),
];

function usersApi(extra: Parameters<typeof mockApi>[0] = {}) {
  return mockApi({
    'GET /api/users': (req: RecordedRequest) => {
      const search = req.query.get('search')?.toLowerCase();
      const items = search
        ? people.filter((p) => p.displayName.toLowerCase().includes(search))
        : people;
      return json(200, {
        items,
        total: search ? items.length : 57,
        page: Number(req.query.get('page')),
        pageSize: Number(req.query.get('pageSize')),
      });
    },
    ...extra,
  });
}

function bodyRows() {
  const table = screen.getByRole('table');
  return within(table).getAllByRole('row').slice(1);
}

describe('People page', () => {
  it('lists people from the API, first page sorted by name', async () => {
    const api = usersApi();
    renderApp('/people', makeSession(me));

    expect(await screen.findByRole('cell', { name: 'Ada Quill' })).toBeInTheDocument();
    const first = api.calls('GET /api/users')[0];
    expect(Object.fromEntries(first?.query ?? [])).toEqual({
      page: '1',
      pageSize: '20',
      sort: 'displayName',
      order: 'asc',
    });

    const rows = bodyRows();
    expect(rows).toHaveLength(3);
    expect(rows[1]).toHaveTextContent('ada.quill@school.example');
    expect(rows[1]).toHaveTextContent('Teacher');
    expect(rows[1]).toHaveTextContent('Examiner');
    expect(rows[2]).toHaveTextContent('Deactivated');
    expect(screen.getByText('1–20 of 57')).toBeInTheDocument();
  });

  it('searches on the server once typing settles', async () => {
    const api = usersApi();
    renderApp('/people', makeSession(me));
    await screen.findByRole('cell', { name: 'Ada Quill' });

    await userEvent.setup().type(screen.getByLabelText('Search'), 'mira');
    await waitFor(() => expect(bodyRows()).toHaveLength(1));
    expect(bodyRows()[0]).toHaveTextContent('Mira Osei');
    // Debounced: one request for the settled text, not one per key.
    const searches = api
      .calls('GET /api/users')
      .map((r) => r.query.get('search'))
      .filter(Boolean);
    expect(searches).toEqual(['mira']);
  });

  it('sorts on the server when a column header is chosen', async () => {
    const api = usersApi();
    renderApp('/people', makeSession(me));
    await screen.findByRole('cell', { name: 'Ada Quill' });
    const user = userEvent.setup();

    await user.click(screen.getByRole('columnheader', { name: /E-mail/ }));
    await waitFor(() =>
      expect(api.calls('GET /api/users').at(-1)?.query.get('sort')).toBe('email'),
    );
    expect(api.calls('GET /api/users').at(-1)?.query.get('order')).toBe('asc');

    await user.click(screen.getByRole('columnheader', { name: /E-mail/ }));
    await waitFor(() =>
      expect(api.calls('GET /api/users').at(-1)?.query.get('order')).toBe('desc'),
    );
  });

  it('moves to the next page on the server', async () => {
    const api = usersApi();
    renderApp('/people', makeSession(me));
    await screen.findByRole('cell', { name: 'Ada Quill' });
    await userEvent.setup().click(screen.getByRole('button', { name: 'Next Page' }));
    await waitFor(() => expect(api.calls('GET /api/users').at(-1)?.query.get('page')).toBe('2'));
  });

  it('adds a person: checks the fields, shows a clash beside the e-mail, then saves and refreshes the list', async () => {
    let attempts = 0;
    const api = usersApi({
      'POST /api/users': (req) => {
        attempts += 1;
        if (attempts === 1)
          return apiError(409, 'Someone in this organisation already has that e-mail.');
        return json(201, makeUserRow(req.body as Partial<UserRow>));
      },
    });
    renderApp('/people', makeSession(me));
    await screen.findByRole('cell', { name: 'Ada Quill' });
    const user = userEvent.setup();

    await user.click(screen.getByRole('button', { name: 'Add a person' }));
    const dialog = await screen.findByRole('dialog', { name: 'Add a person' });
    await user.click(within(dialog).getByRole('button', { name: 'Add person' }));
    expect(await within(dialog).findByText('Enter a name.')).toBeInTheDocument();
    expect(within(dialog).getByText('Choose at least one role.')).toBeInTheDocument();
    expect(api.calls('POST /api/users')).toHaveLength(0);

    await user.type(within(dialog).getByLabelText('Name'), 'Tom Reyes');
    await user.type(within(dialog).getByLabelText('E-mail'), 'tom.reyes@school.example');
    await user.click(within(dialog).getByLabelText('Teacher'));
    await user.type(within(dialog).getByLabelText('First password (optional)'), 'short');
    await user.click(within(dialog).getByRole('button', { name: 'Add person' }));
    expect(await within(dialog).findByText('Use at least 12 characters.')).toBeInTheDocument();
    await user.clear(within(dialog).getByLabelText('First password (optional)'));

    await user.click(within(dialog).getByRole('button', { name: 'Add person' }));
    await waitFor(() =>
      expect(within(dialog).getByLabelText('E-mail')).toHaveAccessibleDescription(
        'Someone in this organisation already has that e-mail.',
      ),
    );
    expect(within(dialog).queryByRole('alert')).not.toBeInTheDocument();
    expect(api.calls('POST /api/users')[0]?.body).toEqual({
      email: 'tom.reyes@school.example',
      displayName: 'Tom Reyes',
      roles: ['teacher'],
    });

    const listCallsBefore = api.calls('GET /api/users').length;
    await user.click(within(dialog).getByRole('button', { name: 'Add person' }));
    await waitFor(() =>
      expect(screen.queryByRole('dialog', { name: 'Add a person' })).not.toBeInTheDocument(),
    );
    await waitFor(() =>
      expect(api.calls('GET /api/users').length).toBeGreaterThan(listCallsBefore),
    );
    expect(await screen.findByText('Tom Reyes was added.')).toBeInTheDocument();
  });

  it('edits roles, sending only what changed', async () => {
    const patch = mockApi({
      'GET /api/users': () => json(200, { items: people, total: 3, page: 1, pageSize: 20 }),
      [`PATCH /api/users/${people[1]?.id}`]: (req) =>
        json(200, { ...people[1], ...(req.body as object) }),
    });
    renderApp('/people', makeSession(me));
    await screen.findByRole('cell', { name: 'Ada Quill' });
    const user = userEvent.setup();

    await user.click(screen.getByRole('button', { name: 'Edit Ada Quill' }));
    const dialog = await screen.findByRole('dialog', { name: 'Edit Ada Quill' });
    await user.click(within(dialog).getByLabelText('Examiner'));
    await user.click(within(dialog).getByRole('button', { name: 'Save changes' }));

    await waitFor(() => expect(patch.calls(`PATCH /api/users/${people[1]?.id}`)).toHaveLength(1));
    expect(patch.calls(`PATCH /api/users/${people[1]?.id}`)[0]?.body).toEqual({
      roles: ['teacher'],
    });
  });

  it('deactivates after a confirmation, and never offers it for your own sign-in', async () => {
    const api = usersApi({
      [`PATCH /api/users/${people[1]?.id}`]: (req) =>
        json(200, { ...people[1], ...(req.body as object) }),
      [`PATCH /api/users/${people[2]?.id}`]: (req) =>
        json(200, { ...people[2], ...(req.body as object) }),
    });
    renderApp('/people', makeSession(me));
    await screen.findByRole('cell', { name: 'Ada Quill' });
    const user = userEvent.setup();

    expect(screen.getByRole('button', { name: 'Deactivate Rowan Hale' })).toBeDisabled();

    await user.click(screen.getByRole('button', { name: 'Deactivate Ada Quill' }));
    const confirm = await screen.findByRole('dialog', { name: 'Deactivate Ada Quill?' });
    await user.click(within(confirm).getByRole('button', { name: 'Deactivate' }));
    await waitFor(() => expect(api.calls(`PATCH /api/users/${people[1]?.id}`)).toHaveLength(1));
    expect(api.calls(`PATCH /api/users/${people[1]?.id}`)[0]?.body).toEqual({ active: false });

    await user.click(screen.getByRole('button', { name: 'Reactivate Mira Osei' }));
    await waitFor(() =>
      expect(api.calls(`PATCH /api/users/${people[2]?.id}`)[0]?.body).toEqual({ active: true }),
    );
  });
});
