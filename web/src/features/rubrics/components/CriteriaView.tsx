import type { RubricCriterion } from '@stavemark/shared';
import { formatWeightShare, isTensionCriterion, undescribedMarks } from './labels';
import { HealthCaution } from './HealthCaution';

function marks(min: number, max: number): string {
  return min === max ? String(min) : `${min}–${max}`;
}

/** A rubric version's criteria as a teacher or examiner reads them: weights, maxima, levels. */
export function CriteriaView({ criteria }: { criteria: readonly RubricCriterion[] }) {
  const total = criteria.reduce((s, c) => s + c.weight, 0);
  return (
    <ol className="sm-criteria">
      {criteria.map((c) => {
        const gaps = undescribedMarks(c.maxMark, c.descriptors);
        return (
          <li key={c.key} className="sm-sheet sm-criterion">
            <div className="sm-criterion-head">
              <h3>{c.label}</h3>
              <dl className="sm-criterion-facts">
                <div>
                  <dt>Weight</dt>
                  <dd>
                    {c.weight}{' '}
                    <span className="sm-muted">({formatWeightShare(c.weight, total)})</span>
                  </dd>
                </div>
                <div>
                  <dt>Marks</dt>
                  <dd>0–{c.maxMark}</dd>
                </div>
                <div>
                  <dt>Key</dt>
                  <dd>
                    <code>{c.key}</code>
                  </dd>
                </div>
              </dl>
            </div>
            {c.description && <p className="sm-criterion-description">{c.description}</p>}
            {isTensionCriterion(c) && <HealthCaution />}
            <table className="sm-table sm-levels">
              <caption className="sm-visually-hidden">Level descriptors for {c.label}</caption>
              <thead>
                <tr>
                  <th scope="col" className="sm-num">
                    Marks
                  </th>
                  <th scope="col">What the examiner hears and sees</th>
                </tr>
              </thead>
              <tbody>
                {[...c.descriptors]
                  .sort((a, b) => b.min - a.min)
                  .map((d) => (
                    <tr key={`${d.min}-${d.max}`}>
                      <td className="sm-num">{marks(d.min, d.max)}</td>
                      <td>{d.text}</td>
                    </tr>
                  ))}
              </tbody>
            </table>
            {gaps.length > 0 && (
              <p className="sm-field-hint">
                No descriptor for {gaps.length === 1 ? 'mark' : 'marks'} {gaps.join(', ')}.
              </p>
            )}
          </li>
        );
      })}
    </ol>
  );
}
