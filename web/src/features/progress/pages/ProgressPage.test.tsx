import { describe, expect, it, vi } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { TENSION_CAUTION, type ProgressView } from '@stavemark/shared';
import { ProgressContent } from './ProgressPage';

// jsdom has no canvas (toolchain.md): the chart is replaced by a stand-in naming its series.
vi.mock('react-chartjs-2', () => ({
  Line: (p: { 'aria-label': string; data: { datasets: { label: string }[] } }) => (
    <div role="img" aria-label={p['aria-label']}>
      {p.data.datasets.map((d) => d.label).join(' | ')}
    </div>
  ),
}));

const crit = (tension: number) => [
  { key: 'note_accuracy', label: 'Note accuracy', fraction: 0.7 },
  { key: 'freedom_from_tension', label: 'Freedom from tension', fraction: tension },
];
const sitting = (n: number, date: string, outcome: 'completed' | 'absent', pct: number | null, line = 0) => ({
  sittingId: `s${n}`,
  slotId: `sl${n}`,
  title: `Mock ${n}`,
  date,
  outcome,
  listName: line ? 'Grade 5 technique' : 'Grade 3 technique',
  lineageId: line ? 'g5' : 'g3',
  grade: line ? '5' : '3',
  line,
  result:
    pct === null
      ? null
      : { percentage: pct, total: Math.round(pct * 0.3), outOf: 30, band: { key: 'pass', label: 'Pass' }, criteria: crit(0.4), slips: 3, notesPlayed: 150, slipRate: 2, released: true },
  examiners: ['Priya Halvorsen'],
  comments: pct === null ? [] : [{ examiner: 'Priya Halvorsen', role: 'first' as const, about: 'overall', text: `Comment for mock ${n}.` }],
});

const view: ProgressView = {
  student: { id: 'st', name: 'Rowan Hale', pupilNumber: 'X1', grade: 5 },
  from: '2025-12-01',
  to: '2026-12-01',
  sittings: [sitting(1, '2026-02-01', 'completed', 60), sitting(2, '2026-03-01', 'absent', null), sitting(3, '2026-10-01', 'completed', 58, 1), sitting(4, '2026-11-01', 'completed', 66, 1)],
  lines: [
    { lineageId: 'g3', grade: '3', listName: 'Grade 3 technique', from: '2026-02-01', to: '2026-03-01', n: 1, slopePer30Days: null, standardError: null, firstToLatest: { first: 60, latest: 60, change: 0 } },
    { lineageId: 'g5', grade: '5', listName: 'Grade 5 technique', from: '2026-10-01', to: '2026-11-01', n: 2, slopePer30Days: 7.74, standardError: null, firstToLatest: { first: 58, latest: 66, change: 8 } },
  ],
  percentile: { value: null, students: 6, grade: '5', lineageId: 'g5' },
  tensionCaution: TENSION_CAUTION,
};

describe('ProgressContent', () => {
  it('summarises each comparable line, says why the percentile is hidden, and shows the caution', () => {
    render(<ProgressContent v={view} own staff={false} />, { wrapper: MemoryRouter });
    expect(screen.getByRole('heading', { name: 'Your progress' })).toBeInTheDocument();
    expect(screen.getByText(/from 58\.0 % to 66\.0 % \(\+8\.0 points\)/)).toBeInTheDocument();
    expect(screen.getByText(/A change of grade or requirement list starts a new line/)).toBeInTheDocument();
    expect(screen.getByText(/fewer than 10 students of grade 5/)).toBeInTheDocument();
    expect(screen.getByRole('note', { name: 'Health caution' })).toHaveTextContent('does not diagnose');
    expect(screen.getByRole('img', { name: 'Overall percentage per sitting' })).toHaveTextContent('Grade 3 technique (grade 3) | Grade 5 technique (grade 5)');
  });

  it('switches a chart to its table: the absent sitting is a row marked absent, not a zero', async () => {
    render(<ProgressContent v={view} own staff={false} />, { wrapper: MemoryRouter });
    const card = screen.getByRole('heading', { name: 'Overall percentage' }).closest('section')!;
    await userEvent.click(within(card).getByRole('button', { name: 'Show table' }));
    expect(within(card).getByRole('button', { name: 'Show chart' })).toHaveAttribute('aria-pressed', 'true');
    const rows = within(card).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(4);
    expect(rows[1]).toHaveTextContent('Absent');
    expect(rows[1]).not.toHaveTextContent('0 %');
    expect(rows[3]).toHaveTextContent('66.0 %');
    // The comments timeline lists the newest first.
    const items = within(screen.getByRole('heading', { name: 'Examiners’ comments' }).closest('section')!).getAllByRole('heading', { level: 3 });
    expect(items[0]).toHaveTextContent('Mock 4');
  });
});
