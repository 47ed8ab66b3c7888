import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { renderApp } from '@/test/render';
import { json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

describe('recording retention (admin)', () => {
  it('refuses a period outside the allowed range with the shared rule’s message, and saves a good one', async () => {
    const api = mockApi({
      'GET /api/recording-settings': () => json(200, { retentionDays: 180, maxBytes: 200 * 1024 * 1024, stored: 3, dueForDeletion: 0 }),
      'PUT /api/recording-settings': (req) =>
        json(200, { retentionDays: (req.body as { retentionDays: number }).retentionDays, maxBytes: 200 * 1024 * 1024, stored: 3, dueForDeletion: 1 }),
    });
    renderApp('/recordings/settings', makeSession(makeUser(['admin'])));
    const input = await screen.findByLabelText('Keep each recording for (days)');
    expect(input).toHaveValue(180);
    expect(screen.getByText(/3 recordings stored/)).toBeInTheDocument();
    fireEvent.change(input, { target: { value: '3' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Keep recordings at least 7 days.')).toBeInTheDocument();
    expect(api.calls('PUT /api/recording-settings')).toHaveLength(0);
    fireEvent.change(input, { target: { value: '90' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(api.calls('PUT /api/recording-settings')).toHaveLength(1));
    expect(api.calls('PUT /api/recording-settings')[0]!.body).toEqual({ retentionDays: 90 });
    expect(await screen.findByText(/recordings are kept 90 days; 1 recording will be deleted/)).toBeInTheDocument();
  });
});
