import { beforeEach, describe, expect, it, vi } from 'vitest';
import { act, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { PrimeReactProvider } from 'primereact/api';
import type { ImportReport } from '@stavemark/shared';
import { ApiError } from '@/lib/api-client';
import { importClassList } from '../api/transfer';
import { ImportDialog } from './ImportDialog';

vi.mock('../api/transfer', () => ({ importClassList: vi.fn(), downloadFile: vi.fn() }));
const importMock = vi.mocked(importClassList);

function report(overrides: Partial<ImportReport> = {}): ImportReport {
  return {
    dryRun: true,
    applied: false,
    fileName: 'list.csv',
    delimiter: ',',
    rowCount: 2,
    counts: { new: 1, updated: 0, unchanged: 0, error: 1 },
    rows: [
      {
        line: 2,
        status: 'new',
        pupilNumber: 'KL2101',
        name: 'Maren Ashcombe',
        classCode: 'TUE-BEG',
        changes: [],
        errors: [],
      },
      {
        line: 3,
        status: 'error',
        pupilNumber: 'KL2103',
        name: 'Juniper Calloway-Reyes',
        classCode: 'TUE-BEG',
        changes: [],
        errors: ['Date of birth “2017-02-30” is not a real date: check the day and the month.'],
      },
    ],
    newClassCodes: ['TUE-BEG'],
    invitations: 0,
    guardianNotices: 1,
    importDate: '2026-12-01',
    ...overrides,
  };
}

function setup() {
  const client = new QueryClient();
  render(
    <PrimeReactProvider>
      <QueryClientProvider client={client}>
        <ImportDialog visible onHide={() => {}} />
      </QueryClientProvider>
    </PrimeReactProvider>,
  );
  return userEvent.setup();
}
const file = (name = 'list.csv') => new File(['Pupil number,…'], name, { type: 'text/csv' });

describe('the import dialog', () => {
  beforeEach(() => importMock.mockReset());

  it('a check with an error row shows the line and the message, and offers no import', async () => {
    importMock.mockResolvedValueOnce(report());
    const user = setup();
    await user.upload(screen.getByLabelText('Class list file (CSV)'), file());
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    expect(
      await screen.findByText(/1 row has an error, so this file cannot be imported yet/),
    ).toBeInTheDocument();
    expect(screen.getByText(/2017-02-30/)).toBeInTheDocument();
    expect(screen.getByText('1 with an error')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /^Import \d/ })).not.toBeInTheDocument();
    expect(importMock).toHaveBeenCalledWith(expect.any(File), true, expect.any(Function));
  });

  it('a clean check offers the import; a refused import shows the server’s report', async () => {
    const clean = report({
      counts: { new: 2, updated: 0, unchanged: 0, error: 0 },
      rows: report().rows.map((r) => ({ ...r, status: 'new' as const, errors: [] })),
    });
    importMock.mockResolvedValueOnce(clean);
    importMock.mockRejectedValueOnce(
      new ApiError({
        statusCode: 400,
        error: 'Bad Request',
        message:
          '1 row has an error, so nothing was imported. Correct the file and upload it again.',
        details: { report: report({ dryRun: false }) },
      }),
    );
    const user = setup();
    await user.upload(screen.getByLabelText('Class list file (CSV)'), file());
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    await user.click(await screen.findByRole('button', { name: 'Import 2 rows' }));
    await waitFor(() =>
      expect(importMock).toHaveBeenLastCalledWith(expect.any(File), false, expect.any(Function)),
    );
    expect(
      await screen.findByText(
        '1 row has an error, so nothing was imported. Correct the file and upload it again.',
      ),
    ).toBeInTheDocument();
    expect(screen.getByText(/2017-02-30/)).toBeInTheDocument();
  });
});

describe('the import dialog’s progress', () => {
  beforeEach(() => importMock.mockReset());

  it('shows the upload, then the server’s own progress as a filling bar with its step', async () => {
    let tell: (p: { phase: 'uploading' | 'processing'; fraction: number | null; step?: string }) => void = () => {};
    let finish: (r: ImportReport) => void = () => {};
    importMock.mockImplementationOnce((_file, _dry, onProgress) => {
      tell = onProgress!;
      return new Promise<ImportReport>((resolve) => (finish = resolve));
    });
    const user = setup();
    await user.upload(screen.getByLabelText('Class list file (CSV)'), file());
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    act(() => tell({ phase: 'uploading', fraction: 0.4 }));
    expect(await screen.findByText('Uploading the file… 40%')).toBeInTheDocument();
    expect(screen.getByRole('progressbar', { name: 'Upload progress' })).toHaveAttribute('aria-valuenow', '40');
    act(() => tell({ phase: 'processing', fraction: null }));
    expect(await screen.findByText('Checking: waiting for the server…')).toBeInTheDocument();
    act(() => tell({ phase: 'processing', fraction: 0.71, step: 'Checking every row' }));
    expect(await screen.findByText('Checking: Checking every row… 71%')).toBeInTheDocument();
    expect(screen.getByRole('progressbar', { name: 'Import progress' })).toHaveAttribute('aria-valuenow', '71');
    act(() => finish(report()));
    expect(await screen.findByText(/1 row has an error/)).toBeInTheDocument();
  });
});
