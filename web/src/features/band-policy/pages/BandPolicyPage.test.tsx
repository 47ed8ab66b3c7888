import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { BandPolicyView } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const v1 = {
  id: 'bp-1',
  version: 1,
  createdAt: '2026-09-01T08:00:00Z',
  createdBy: null,
  bands: [
    { key: 'distinction', label: 'Distinction', minPercent: 80 },
    { key: 'merit', label: 'Merit', minPercent: 70 },
    { key: 'pass', label: 'Pass', minPercent: 55 },
  ],
  below: { key: 'not_yet_passed', label: 'Not yet passed' },
};
const view: BandPolicyView = { current: v1, versions: [v1] };

describe('the band policy page', () => {
  it('shows a teacher each band with the range it covers, and no form', async () => {
    mockApi({ 'GET /api/band-policy': () => json(200, view) });
    renderApp('/band-policy', makeSession(makeUser(['teacher'])));
    const table = await screen.findByRole('table', { name: 'Current bands' });
    const rows = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((r) => r.textContent);
    expect(rows).toEqual([
      'Distinction80 % and above',
      'Merit70 % to below 80 %',
      'Pass55 % to below 70 %',
      'Not yet passedbelow 55 %',
    ]);
    expect(screen.queryByRole('button', { name: /Save as version/ })).toBeNull();
  });

  it('refuses thresholds out of order with the shared rule, then saves a new version as the admin typed it', async () => {
    const api = mockApi({
      'GET /api/band-policy': () => json(200, view),
      'POST /api/band-policy': (req) => {
        const body = req.body as Pick<BandPolicyView['current'], 'bands' | 'below'>;
        const v2 = {
          ...body,
          id: 'bp-2',
          version: 2,
          createdAt: '2026-12-02T09:00:00Z',
          createdBy: { id: 'p', displayName: 'Morwenna Tilley' },
        };
        return json(201, { current: v2, versions: [v1, v2] });
      },
    });
    renderApp('/band-policy', makeSession(makeUser(['admin'])));
    const merit = await screen.findByLabelText('Band 2: lowest share (%)');
    fireEvent.change(merit, { target: { value: '85' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save as version 2' }));
    expect(
      await screen.findByText(
        'List bands from the highest threshold down, each lower than the one before.',
      ),
    ).toBeInTheDocument();
    expect(api.calls('POST /api/band-policy')).toHaveLength(0);
    fireEvent.change(merit, { target: { value: '65' } });
    fireEvent.change(screen.getByLabelText('Band 3: lowest share (%)'), {
      target: { value: '50' },
    });
    fireEvent.click(screen.getByRole('button', { name: 'Save as version 2' }));
    await waitFor(() => expect(api.calls('POST /api/band-policy')).toHaveLength(1));
    expect(api.calls('POST /api/band-policy')[0]!.body).toEqual({
      bands: [
        { key: 'distinction', label: 'Distinction', minPercent: 80 },
        { key: 'merit', label: 'Merit', minPercent: 65 },
        { key: 'pass', label: 'Pass', minPercent: 50 },
      ],
      below: { key: 'not_yet_passed', label: 'Not yet passed' },
    });
    expect(await screen.findByText(/Saved as version 2/)).toBeInTheDocument();
    const history = screen.getByRole('table', { name: 'Versions of the band policy' });
    expect(within(history).getAllByRole('row')[1]!.textContent).toContain('Merit 65 %');
    expect(within(history).getAllByRole('row')[1]!.textContent).toContain('by Morwenna Tilley');
  });
});
