import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi } from '@/test/fetch-mock';

const TOKEN = 'Q_50nKr4Cfq63vorwuvleIqgeo6yWoGy9e0rCoxfhAI';

describe('choosing a password through an e-mailed link', () => {
  it('greets the invited person, checks the two entries, and sends the token from the fragment', async () => {
    const api = mockApi({
      'POST /api/account/link': () =>
        json(200, {
          purpose: 'invitation',
          displayName: 'Saoirse Lambourne',
          organisationName: 'Larkfield Music School',
          expiresAt: '2026-12-04T12:00:00Z',
        }),
      'POST /api/account/accept-invitation': () =>
        json(200, { message: 'Your password is set. Welcome to Stavemark: you can sign in now.' }),
    });
    renderApp(`/account/welcome#token=${TOKEN}`, null);
    expect(
      await screen.findByText(
        /Hello Saoirse Lambourne\. Choose a password for your account at Larkfield Music School\./,
      ),
    ).toBeInTheDocument();
    const user = userEvent.setup();
    await user.type(screen.getByLabelText('New password'), 'a-fine-long-password');
    await user.type(screen.getByLabelText('The same password again'), 'a-fine-long-passwerd');
    await user.click(screen.getByRole('button', { name: 'Save my password' }));
    expect(await screen.findByText('The two passwords are not the same.')).toBeInTheDocument();
    expect(api.calls('POST /api/account/accept-invitation')).toHaveLength(0);

    await user.clear(screen.getByLabelText('The same password again'));
    await user.type(screen.getByLabelText('The same password again'), 'a-fine-long-password');
    await user.click(screen.getByRole('button', { name: 'Save my password' }));
    expect(await screen.findByText(/Your password is set/)).toBeInTheDocument();
    expect(api.calls('POST /api/account/accept-invitation')[0]!.body).toEqual({
      token: TOKEN,
      password: 'a-fine-long-password',
    });
    expect(api.calls('POST /api/account/link')[0]!.body).toEqual({ token: TOKEN });
    expect(screen.getByRole('link', { name: 'Go to sign-in' })).toHaveAttribute('href', '/sign-in');
  });

  it('a spent or expired link says so and offers a fresh one', async () => {
    mockApi({
      'POST /api/account/link': () =>
        apiError(400, 'This link has expired or has already been used.'),
    });
    renderApp(`/account/reset-password#token=${TOKEN}`, null);
    expect(await screen.findByRole('alert')).toHaveTextContent(
      'This link has expired or has already been used.',
    );
    expect(screen.getByRole('link', { name: 'ask for a fresh link' })).toHaveAttribute(
      'href',
      '/account/forgot-password',
    );
    expect(screen.queryByLabelText('New password')).not.toBeInTheDocument();
  });

  it('a link without its token asks nothing of the server', async () => {
    const api = mockApi({});
    renderApp('/account/welcome', null);
    expect(await screen.findByRole('alert')).toHaveTextContent(
      /incomplete, has expired, or was used already/,
    );
    expect(api.requests).toHaveLength(0);
  });
});
