import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';
import { sessionStore } from '@/lib/session-store';

const today = {
  date: '2026-12-01',
  timeZone: 'Europe/London',
  organisationName: 'Larkfield Music School',
  roles: ['teacher'],
  teacher: { classes: [] },
};

async function fillAndSubmit(email: string, password: string) {
  const user = userEvent.setup();
  if (email) await user.type(screen.getByLabelText('E-mail'), email);
  if (password) await user.type(screen.getByLabelText('Password'), password);
  await user.click(screen.getByRole('button', { name: 'Sign in' }));
}

describe('sign-in page', () => {
  it('offers a way to choose a new password', async () => {
    mockApi({});
    renderApp('/sign-in', null);
    const link = await screen.findByRole('link', { name: 'Forgotten your password?' });
    expect(link).toHaveAttribute('href', '/account/forgot-password');
  });

  it('checks the fields with the shared login rules before asking the server', async () => {
    const api = mockApi({});
    renderApp('/sign-in', null);
    await screen.findByRole('heading', { name: 'Sign in' });

    await fillAndSubmit('', '');
    expect(await screen.findByText('Enter a valid e-mail address.')).toBeInTheDocument();
    expect(screen.getByText('Enter your password.')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByLabelText('E-mail')).toHaveAccessibleDescription(
      'Enter a valid e-mail address.',
    );

    await fillAndSubmit('not-an-address', 'x');
    expect(await screen.findByText('Enter a valid e-mail address.')).toBeInTheDocument();
    expect(api.requests).toHaveLength(0);
  });

  it('shows the API message for a wrong password in an alert', async () => {
    const api = mockApi({
      'POST /api/auth/login': () => apiError(401, 'The e-mail or password is not right.'),
    });
    renderApp('/sign-in', null);
    await screen.findByRole('heading', { name: 'Sign in' });

    await fillAndSubmit('Teacher@Demo.Example ', 'wrong-password');

    expect(await screen.findByRole('alert')).toHaveTextContent(
      'The e-mail or password is not right.',
    );
    // The shared schema trims and lower-cases the e-mail before it is sent.
    expect(api.calls('POST /api/auth/login')[0]?.body).toEqual({
      email: 'teacher@demo.example',
      password: 'wrong-password',
    });
    expect(api.calls('POST /api/auth/refresh')).toHaveLength(0);
    expect(screen.getByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
  });

  it('shows how long to wait when sign-in is rate-limited, and holds the button until then', async () => {
    mockApi({
      'POST /api/auth/login': () =>
        apiError(
          429,
          'Too many sign-in attempts. Please wait 30 seconds and try again.',
          {},
          { 'Retry-After': '30' },
        ),
    });
    renderApp('/sign-in', null);
    await screen.findByRole('heading', { name: 'Sign in' });

    await fillAndSubmit('teacher@demo.example', 'stavemark-demo');

    expect(await screen.findByRole('alert')).toHaveTextContent(
      'Too many sign-in attempts. Please wait 30 seconds and try again.',
    );
    // The wait comes from Retry-After and counts down on the button.
    expect(screen.getByRole('button', { name: /^Try again in (30|29) seconds$/ })).toBeDisabled();
  });

  it('lets the person try again once the wait is over', async () => {
    mockApi({
      'POST /api/auth/login': () =>
        apiError(
          429,
          'Too many sign-in attempts. Please wait 2 seconds and try again.',
          {},
          { 'Retry-After': '2' },
        ),
    });
    renderApp('/sign-in', null);
    await screen.findByRole('heading', { name: 'Sign in' });
    await fillAndSubmit('teacher@demo.example', 'stavemark-demo');
    expect(
      await screen.findByRole('button', { name: /^Try again in [12] seconds?$/ }),
    ).toBeDisabled();
    expect(await screen.findByRole('button', { name: 'Sign in' }, { timeout: 4000 })).toBeEnabled();
    expect(screen.getByRole('alert')).toHaveTextContent('You can try to sign in again now.');
  });

  it('signs in and opens Today', async () => {
    mockApi({
      'POST /api/auth/login': () => json(200, makeSession(makeUser(['teacher']))),
      'GET /api/today': () => json(200, today),
    });
    renderApp('/sign-in', null);
    await screen.findByRole('heading', { name: 'Sign in' });

    await fillAndSubmit('teacher@demo.example', 'stavemark-demo');

    expect(await screen.findByRole('heading', { name: 'Today' })).toBeInTheDocument();
    expect(sessionStore.getAccessToken()).toBe('token-1');
  });

  it('after a session ends, says so and returns to the page the person was on', async () => {
    const admin = makeUser(['admin']);
    let signedInAgain = false;
    mockApi({
      'GET /api/users': () =>
        signedInAgain
          ? json(200, { items: [], total: 0, page: 1, pageSize: 20 })
          : apiError(401, 'Expired.'),
      'POST /api/auth/refresh': () => apiError(401, 'No session.'),
      'POST /api/auth/login': () => {
        signedInAgain = true;
        return json(200, makeSession(admin, 'token-2'));
      },
    });
    const { router } = renderApp('/people', makeSession(admin));

    const notice = await screen.findByText('Your session has ended; please sign in again.');
    expect(notice.closest('[role="status"]')).not.toBeNull();
    expect(screen.getByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(sessionStore.getAccessToken()).toBeNull();

    await fillAndSubmit('admin@demo.example', 'stavemark-demo');
    expect(await screen.findByRole('heading', { name: 'People' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/people');
    expect(
      screen.queryByText('Your session has ended; please sign in again.'),
    ).not.toBeInTheDocument();
  });

  it('a page behind sign-in sends a signed-out visitor to sign in', async () => {
    mockApi({});
    const { router } = renderApp('/people', null);
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
  });
});
