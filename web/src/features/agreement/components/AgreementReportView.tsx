import { lazy, Suspense } from 'react';
import type { AgreementReport, InterpretationScale, Interpretation } from '@stavemark/shared';
import { formatPlainDate } from '@/lib/format';
import { coefficient, percent, shortSource, signed } from '@/lib/stats-format';

// The chart library loads only with a chart to draw.
const SeverityChart = lazy(() => import('./SeverityChart').then((m) => ({ default: m.SeverityChart })));

function Reading({ interpretation, note }: { interpretation: Interpretation | null; note: string | null }) {
  if (interpretation)
    return (
      <>
        <strong>{interpretation.label}</strong> <span className="sm-muted">on the scale of {shortSource(interpretation.source)}</span>
      </>
    );
  return <span className="sm-muted">{note ?? 'No interpretation.'}</span>;
}

function ScaleTable({ scale }: { scale: InterpretationScale }) {
  const rows = scale.bands.map((b, i) => {
    const upper = i === 0 ? null : scale.bands[i - 1]!.min;
    const from = `${b.inclusive ? '≥' : '>'} ${b.min}`;
    return { label: b.label, range: upper === null ? from : `${from} and below ${upper}` };
  });
  return (
    <figure className="sm-scale">
      <figcaption>
        <strong>{shortSource(scale.source)}</strong>, for {scale.statistic}: {scale.source}
        {scale.note && <span className="sm-muted"> {scale.note}</span>}
      </figcaption>
      <ul>
        {rows.map((r) => (
          <li key={r.label}>
            {r.label}: {r.range}
          </li>
        ))}
        <li>
          {scale.below}: below {scale.bands.at(-1)!.min}
        </li>
      </ul>
    </figure>
  );
}

/** The agreement report of a sitting or a term, every figure with its reading and source. */
export function AgreementReportView({ report }: { report: AgreementReport }) {
  const { icc, bands, counts } = report;
  const leftOut = counts.notCompleted + counts.notSubmitted;
  const severityShown = report.severity.some((s) => s.shown);
  return (
    <div className="sm-agreement">
      <p className="sm-muted">
        {report.scope.kind === 'term'
          ? `${report.sittings.length} sitting${report.sittings.length === 1 ? '' : 's'} from ${formatPlainDate(report.scope.from)} to ${formatPlainDate(report.scope.to)}. `
          : ''}
        {counts.included} double-marked candidate{counts.included === 1 ? '' : 's'} with both sheets submitted
        {leftOut > 0 &&
          ` (left out: ${counts.notCompleted} absent, withdrawn or incomplete; ${counts.notSubmitted} with a sheet not yet submitted)`}
        . Totals are compared as a percentage of each paper’s total marks.
      </p>

      <section className="sm-sheet" aria-labelledby="icc-title">
        <h2 id="icc-title">Agreement on totals: {icc.form}</h2>
        <dl className="sm-figures">
          <div>
            <dt>{icc.form}</dt>
            <dd data-testid="icc-value">{coefficient(icc.value)}</dd>
          </div>
          <div>
            <dt>95 % confidence interval</dt>
            <dd>{icc.lower === null ? '—' : `${coefficient(icc.lower)} to ${coefficient(icc.upper)}`}</dd>
          </div>
          <div>
            <dt>Candidates</dt>
            <dd>{icc.n}</dd>
          </div>
        </dl>
        <p>
          Reading: <Reading interpretation={icc.interpretation} note={icc.note} />
          {icc.intervalInterpretation && (
            <>
              {' '}
              — the interval runs from <strong>{icc.intervalInterpretation.lower}</strong> to{' '}
              <strong>{icc.intervalInterpretation.upper}</strong>.
            </>
          )}
        </p>
        <p className="sm-muted">
          Why {icc.form}: {icc.formReason} Method: {icc.method}
        </p>
      </section>

      <section className="sm-sheet" aria-labelledby="bands-title">
        <h2 id="bands-title">Agreement on bands</h2>
        <dl className="sm-figures">
          <div>
            <dt>Same band</dt>
            <dd>{percent(bands.exact)}</dd>
          </div>
          <div>
            <dt>Same or neighbouring band</dt>
            <dd>{percent(bands.adjacent)}</dd>
          </div>
          <div>
            <dt>Candidates</dt>
            <dd>{bands.n}</dd>
          </div>
        </dl>
        <p className="sm-muted">{bands.note}</p>
        <h3>Quadratic-weighted kappa per pair of examiners</h3>
        {report.pairs.length === 0 ? (
          <p className="sm-muted">No pair of examiners has marked the same candidate yet.</p>
        ) : (
          <table className="sm-table">
            <thead>
              <tr>
                <th scope="col">Examiners</th>
                <th scope="col" className="sm-num">
                  n
                </th>
                <th scope="col" className="sm-num">
                  κ (quadratic)
                </th>
                <th scope="col" className="sm-num">
                  SE
                </th>
                <th scope="col">Reading</th>
              </tr>
            </thead>
            <tbody>
              {report.pairs.map((p) => (
                <tr key={`${p.examiners[0].id}-${p.examiners[1].id}`}>
                  <td>
                    {p.examiners[0].name} and {p.examiners[1].name}
                  </td>
                  <td className="sm-num">{p.n}</td>
                  <td className="sm-num">{coefficient(p.kappa)}</td>
                  <td className="sm-num">{coefficient(p.standardError)}</td>
                  <td>
                    <Reading interpretation={p.interpretation} note={p.note} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section className="sm-sheet" aria-labelledby="severity-title">
        <h2 id="severity-title">Severity against the other marker</h2>
        <p className="sm-muted">
          Each examiner’s mean difference from the other marker of the same candidates, in percentage points of the total, with its standard error and 95 % interval (mean ± t·SE, Student’s t with n − 1 degrees of freedom). Shown from{' '}
          {report.thresholds.minSheetsForSeverity} double-marked sheets. Below zero: marks lower than the other marker (more severe).
        </p>
        <div className="sm-severity">
          {severityShown && (
            <Suspense fallback={<p className="sm-muted">Drawing the chart…</p>}>
              <SeverityChart figures={report.severity} />
            </Suspense>
          )}
          <table className="sm-table" aria-label="Severity of each examiner">
            <thead>
              <tr>
                <th scope="col">Examiner</th>
                <th scope="col" className="sm-num">
                  Sheets
                </th>
                <th scope="col" className="sm-num">
                  Mean difference
                </th>
                <th scope="col" className="sm-num">
                  SE
                </th>
                <th scope="col" className="sm-num">
                  95 % interval
                </th>
                <th scope="col">Reading</th>
              </tr>
            </thead>
            <tbody>
              {report.severity.map((s) => (
                <tr key={s.examiner.id}>
                  <td>{s.examiner.name}</td>
                  <td className="sm-num">{s.n}</td>
                  <td className="sm-num">{s.meanDifference === null ? '—' : signed(s.meanDifference, 2)}</td>
                  <td className="sm-num">{s.standardError === null ? '—' : s.standardError.toFixed(2)}</td>
                  <td className="sm-num">{s.lower === null ? '—' : `${signed(s.lower, 2)} to ${signed(s.upper!, 2)}`}</td>
                  <td>{s.shown ? s.reading : <span className="sm-muted">{s.note}</span>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      <section className="sm-sheet" aria-labelledby="sources-title">
        <h2 id="sources-title">Interpretation scales and their sources</h2>
        <p className="sm-muted">
          A figure is read on a published scale only from {report.thresholds.minCandidates} double-marked candidates (for a pair’s kappa, from {report.thresholds.minCandidates} candidates of that pair); below that the report says “too few to judge”.
        </p>
        {report.scales.map((s) => (
          <ScaleTable key={s.key} scale={s} />
        ))}
      </section>
    </div>
  );
}
