import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { SittingResultsView } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

// jsdom has no canvas: the chart is drawn in the browser; here only its accessible name matters.
vi.mock('react-chartjs-2', () => ({ Bar: (p: { 'aria-label': string }) => <div role="img" aria-label={p['aria-label']} /> }));

const SITTING = '5f1c2b3a-0000-4000-8000-000000000001';
const row = (n: number, name: string, pct: number, band: [string, string]) => ({
  resultId: `5f1c2b3a-0000-4000-8000-00000000010${n}`,
  slotId: `5f1c2b3a-0000-4000-8000-00000000020${n}`,
  sittingId: SITTING,
  sittingTitle: 'Grade 3 mock',
  sittingDate: '2026-11-18',
  student: { id: `5f1c2b3a-0000-4000-8000-00000000030${n}`, name, pupilNumber: `LF10${n}`, grade: 3 },
  listName: 'Grade 3 technique',
  total: Math.round((pct / 100) * 30),
  outOf: 30,
  percentage: pct,
  band: { key: band[0], label: band[1] },
  basis: 'single',
  examiner: 'Sam Examiner',
  releasedAt: null,
});
const view: SittingResultsView = {
  sitting: { id: SITTING, title: 'Grade 3 mock', date: '2026-11-18', room: 'Studio 2', status: 'marking_closed' },
  scope: 'all',
  results: [row(1, 'Ada Pendry', 83.3, ['distinction', 'Distinction']), row(2, 'Bram Tallis', 60, ['pass', 'Pass']), row(3, 'Cleo Sedley', 63.3, ['pass', 'Pass'])],
  withoutResult: [{ slotId: '5f1c2b3a-0000-4000-8000-000000000299', student: { id: 'x', name: 'Dev Ormerod', pupilNumber: 'LF109' }, outcome: 'absent' }],
  summary: {
    results: 3,
    meanPercent: 68.9,
    medianPercent: 63.3,
    bands: [
      { key: 'distinction', label: 'Distinction', count: 1, percent: 33.3 },
      { key: 'merit', label: 'Merit', count: 0, percent: 0 },
      { key: 'pass', label: 'Pass', count: 2, percent: 66.7 },
      { key: 'not_yet_passed', label: 'Not yet passed', count: 0, percent: 0 },
    ],
  },
  criteria: [{ key: 'freedom_from_tension', label: 'Freedom from tension', meanFraction: 0.5, results: 3, tension: true }],
};

// Generous timeouts: the page is a lazy chunk with PrimeReact's table, slow to load on a busy machine.
describe('a sitting’s results page', { timeout: 60_000 }, () => {
  beforeEach(() => {
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: vi.fn(() => 'blob:x'), revokeObjectURL: vi.fn() }));
  });
  afterEach(() => vi.unstubAllGlobals());

  it('shows the band counts as a table beside the chart, the candidates, and the health note for tension', async () => {
    mockApi({ [`GET /api/sittings/${SITTING}/results`]: () => json(200, view) });
    renderApp(`/sittings/${SITTING}/results`, makeSession(makeUser(['teacher'])));
    expect(await screen.findByRole('heading', { name: 'Results: Grade 3 mock', level: 1 }, { timeout: 15_000 })).toBeInTheDocument();
    expect(screen.getByRole('img', { name: /Distinction: 1, Merit: 0, Pass: 2, Not yet passed: 0/ })).toBeInTheDocument();
    const bands = screen.getByRole('table', { name: /Bands in Grade 3 mock \(table\)/ });
    expect(within(bands).getByRole('row', { name: /Pass 2 67\s%/ })).toBeInTheDocument();
    expect(screen.getByText('Ada Pendry')).toBeInTheDocument();
    expect(within(screen.getByRole('table', { name: 'Candidates without a result' })).getByText('Absent')).toBeInTheDocument();
    expect(screen.getByRole('note')).toHaveTextContent(/qualified health professional/);
  });

  it('filters the table by name or pupil number', async () => {
    mockApi({ [`GET /api/sittings/${SITTING}/results`]: () => json(200, view) });
    renderApp(`/sittings/${SITTING}/results`, makeSession(makeUser(['teacher'])));
    const search = await screen.findByLabelText('Search', {}, { timeout: 15_000 });
    fireEvent.change(search, { target: { value: 'bram' } });
    expect(screen.queryByText('Ada Pendry')).not.toBeInTheDocument();
    expect(screen.getByText('Bram Tallis')).toBeInTheDocument();
  });

  it('streams the CSV, counting rows as they arrive, and saves it', async () => {
    const enc = new TextEncoder();
    const parts = ['Pupil number,Given name\r\n', 'LF101,Ada\r\nLF102,', 'Bram\r\nLF103,Cleo\r\n'];
    const api = mockApi({
      [`GET /api/sittings/${SITTING}/results`]: () => json(200, view),
      [`GET /api/sittings/${SITTING}/results/export`]: () =>
        new Response(new ReadableStream({ start(c) { for (const p of parts) c.enqueue(enc.encode(p)); c.close(); } }), {
          status: 200,
          headers: { 'Content-Type': 'text/csv', 'Content-Disposition': 'attachment; filename="results.csv"', 'X-Expected-Rows': '3' },
        }),
    });
    renderApp(`/sittings/${SITTING}/results`, makeSession(makeUser(['teacher'])));
    await userEvent.click(await screen.findByRole('button', { name: 'CSV' }, { timeout: 15_000 }));
    expect(await screen.findByText('Saved 3 rows (1 KB).')).toBeInTheDocument();
    expect(api.calls(`GET /api/sittings/${SITTING}/results/export`)[0]!.query.get('bom')).toBe('true');
  });

  it('says so when an export stops short of the rows the server announced', async () => {
    const api = mockApi({
      [`GET /api/sittings/${SITTING}/results`]: () => json(200, view),
      [`GET /api/sittings/${SITTING}/results/export`]: () =>
        new Response('Pupil number\r\nLF101\r\n', { status: 200, headers: { 'Content-Type': 'text/csv', 'X-Expected-Rows': '3' } }),
    });
    renderApp(`/sittings/${SITTING}/results`, makeSession(makeUser(['teacher'])));
    await userEvent.click(await screen.findByRole('button', { name: 'CSV' }, { timeout: 15_000 }));
    expect(await screen.findByRole('alert')).toHaveTextContent('1 of 3 rows arrived');
    expect(api.unexpected).toEqual([]);
  });
});
