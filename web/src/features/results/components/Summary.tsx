import type { CriterionMean, ResultsSummary } from '@stavemark/shared';
import { LOCALE } from '@/lib/format';

export const pct = (x: number | null) =>
  x === null ? '—' : `${new Intl.NumberFormat(LOCALE, { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(x)}\u00a0%`;

/** The headline figures of a set of results. */
export function Figures({ summary, extra = [] }: { summary: ResultsSummary; extra?: [string, string][] }) {
  return (
    <dl className="sm-figures sm-results-figures">
      <div>
        <dt>Results</dt>
        <dd>{summary.results}</dd>
      </div>
      <div>
        <dt>Mean</dt>
        <dd>{pct(summary.meanPercent)}</dd>
      </div>
      <div>
        <dt>Median</dt>
        <dd>{pct(summary.medianPercent)}</dd>
      </div>
      {extra.map(([label, value]) => (
        <div key={label}>
          <dt>{label}</dt>
          <dd>{value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** Criteria on average, with a bar drawn as text length so it reads without colour. */
export function CriteriaTable({ criteria }: { criteria: CriterionMean[] }) {
  const tension = criteria.some((c) => c.tension);
  return (
    <>
      <table className="sm-table" aria-label="Criteria on average">
        <thead>
          <tr>
            <th scope="col">Criterion</th>
            <th scope="col" className="sm-num">Mean share</th>
            <th scope="col" className="sm-num">Results</th>
          </tr>
        </thead>
        <tbody>
          {criteria.map((c) => (
            <tr key={c.key}>
              <th scope="row">
                {c.label}
                {c.tension && <span className="sm-muted"> (see the health note)</span>}
              </th>
              <td className="sm-num">{pct(c.meanFraction * 100)}</td>
              <td className="sm-num">{c.results}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {tension && (
        <p className="sm-health-caution" role="note">
          <strong>Health note.</strong> Persistent tension can contribute to playing-related pain. If a student reports pain,
          stop and seek advice from a qualified health professional. Stavemark records teaching observations; it does not
          diagnose.
        </p>
      )}
    </>
  );
}
