import { describe, expect, it, vi } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { KOO_LI_2016, LANDIS_KOCH_1977, type AgreementReport } from '@stavemark/shared';
import { shortSource, signed } from '@/lib/stats-format';
import { AgreementReportView } from './AgreementReportView';

// jsdom has no canvas: the chart is checked in the browser suite.
vi.mock('./SeverityChart', () => ({ SeverityChart: () => <div>chart</div> }));

const base: AgreementReport = {
  scope: { kind: 'sitting', id: 's', title: 'Grade 3 mock', from: '2026-11-17', to: '2026-11-17' },
  sittings: [{ id: 's', title: 'Grade 3 mock', date: '2026-11-17' }],
  totalsAs: 'percentage',
  counts: { doubleMarkedSlots: 5, included: 3, notCompleted: 1, notSubmitted: 1 },
  thresholds: { minCandidates: 30, minSheetsForSeverity: 20 },
  icc: {
    form: 'ICC(2,1)',
    formReason: 'The same two examiners (Ada and Bea) marked every candidate.',
    n: 3,
    value: 0.6,
    lower: -0.2,
    upper: 0.98,
    enough: false,
    interpretation: null,
    intervalInterpretation: null,
    note: 'Too few to judge: 3 double-marked candidates, an interpretation needs at least 30.',
    method: 'Shrout & Fleiss (1979).',
  },
  bands: { n: 3, exact: 2 / 3, adjacent: 2 / 3, note: 'No published interpretation scale is applied.' },
  pairs: [
    {
      examiners: [
        { id: 'a', name: 'Ada' },
        { id: 'b', name: 'Bea' },
      ],
      n: 3,
      kappa: 0.5,
      standardError: 0.2,
      enough: false,
      interpretation: null,
      note: 'Too few to judge: 3.',
    },
  ],
  severity: [{ examiner: { id: 'a', name: 'Ada' }, n: 3, shown: false, meanDifference: null, standardError: null, lower: null, upper: null, reading: null, note: 'Shown from 20 double-marked sheets; 3 so far.' }],
  scales: [KOO_LI_2016, LANDIS_KOCH_1977],
};

describe('the agreement report', () => {
  it('below the thresholds: the figures, “too few to judge”, no chart, and the sources in full', () => {
    render(<AgreementReportView report={base} />);
    expect(screen.getByRole('heading', { name: 'Agreement on totals: ICC(2,1)' })).toBeInTheDocument();
    expect(screen.getByTestId('icc-value')).toHaveTextContent('0.600');
    expect(screen.getByText(/^Too few to judge: 3 double-marked/)).toBeInTheDocument();
    expect(screen.getByText(/left out: 1 absent, withdrawn or incomplete; 1 with a sheet not yet submitted/)).toBeInTheDocument();
    expect(screen.getByText(/Koo, T\. K\., & Li, M\. Y\. \(2016\)\. A guideline/)).toBeInTheDocument();
    expect(screen.getByText(/Landis, J\. R\., & Koch, G\. G\. \(1977\)/)).toBeInTheDocument();
    expect(screen.queryByText('chart')).not.toBeInTheDocument();
    const row = within(screen.getByRole('table', { name: 'Severity of each examiner' })).getByRole('row', { name: /Ada/ });
    expect(row).toHaveTextContent('Shown from 20 double-marked sheets; 3 so far.');
  });

  it('at 30 and 20: the reading with its scale, and the chart beside the table', async () => {
    render(
      <AgreementReportView
        report={{
          ...base,
          icc: { ...base.icc, n: 30, enough: true, note: null, interpretation: { label: 'moderate', source: KOO_LI_2016.source }, intervalInterpretation: { lower: 'poor', upper: 'good' } },
          severity: [{ examiner: { id: 'a', name: 'Ada' }, n: 20, shown: true, meanDifference: -2, standardError: 0.23, lower: -2.48, upper: -1.52, reading: 'more severe', note: null }],
        }}
      />,
    );
    expect(screen.getByText('moderate')).toBeInTheDocument();
    expect(screen.getAllByText(/on the scale of Koo & Li \(2016\)/)).toHaveLength(1);
    expect(await screen.findByText('chart')).toBeInTheDocument();
    expect(screen.getByText('more severe')).toBeInTheDocument();
    expect(screen.getByText('−2.48 to −1.52')).toBeInTheDocument();
  });
});

describe('formatting', () => {
  it('short names of the published scales', () => {
    expect(shortSource(KOO_LI_2016.source)).toBe('Koo & Li (2016)');
    expect(shortSource(LANDIS_KOCH_1977.source)).toBe('Landis & Koch (1977)');
    expect(shortSource('Krippendorff, K. (2004). Content Analysis.')).toBe('Krippendorff (2004)');
  });
  it('signed numbers with a real minus sign', () => {
    expect([signed(-2, 1), signed(1.25, 1), signed(0, 2), signed(-0.001, 2)]).toEqual(['−2.0', '+1.3', '0.00', '0.00']);
  });
});
