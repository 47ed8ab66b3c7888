import type { ExerciseView } from '@stavemark/shared';
import { signed, shortSource } from '@/lib/stats-format';

/** After submitting (or for the exercise's managers): reference, deviation, others' marks, alpha. */
export function Results({ view }: { view: ExerciseView }) {
  const ref = new Map((view.referenceMarks ?? []).map((m) => [`${m.request}:${m.criterion}`, m.mark]));
  const mine = new Map((view.myAttempt?.status === 'submitted' ? view.myAttempt.marks : []).map((m) => [`${m.request}:${m.criterion}`, m.mark]));
  const others = new Map((view.othersMarks ?? []).map((o) => [`${o.request}:${o.criterion}`, o.marks]));
  const a = view.agreement;
  const d = view.myDeviation;
  return (
    <div className="sm-std-page">
      {d && (
        <section className="sm-sheet" aria-labelledby="deviation-title">
          <h2 id="deviation-title">Your deviation from the reference</h2>
          <dl className="sm-figures">
            <div>
              <dt>Mean difference</dt>
              <dd>{signed(d.meanDifferencePercent, 1)} points</dd>
            </div>
            <div>
              <dt>Mean distance</dt>
              <dd>{d.meanAbsoluteDifferencePercent.toFixed(1)} points</dd>
            </div>
            <div>
              <dt>Marks exactly as the reference</dt>
              <dd>
                {Math.round(d.exactShare * d.cells)} of {d.cells}
              </dd>
            </div>
          </dl>
          <p className="sm-muted">In percentage points of each criterion’s maximum; below zero you marked lower than the reference.</p>
        </section>
      )}
      <section className="sm-sheet" aria-labelledby="reference-title">
        <h2 id="reference-title">Marks beside the reference</h2>
        {view.requests.map((r, ri) => (
          <table key={ri} className="sm-table" aria-label={`Request ${ri + 1}: ${r.title}`}>
            <caption>
              Request {ri + 1}: {r.title}
            </caption>
            <thead>
              <tr>
                <th scope="col">Criterion</th>
                <th scope="col" className="sm-num">
                  Reference
                </th>
                {mine.size > 0 && (
                  <>
                    <th scope="col" className="sm-num">
                      Yours
                    </th>
                    <th scope="col" className="sm-num">
                      Difference
                    </th>
                  </>
                )}
                <th scope="col">Every submitted examiner (no names)</th>
              </tr>
            </thead>
            <tbody>
              {view.rubric.criteria.map((c) => {
                const k = `${ri}:${c.key}`;
                const rm = ref.get(k);
                const mm = mine.get(k);
                return (
                  <tr key={c.key}>
                    <th scope="row">{c.label}</th>
                    <td className="sm-num">{rm === undefined ? '—' : `${rm} / ${c.maxMark}`}</td>
                    {mine.size > 0 && (
                      <>
                        <td className="sm-num">{mm ?? '—'}</td>
                        <td className="sm-num">{mm === undefined || rm === undefined ? '—' : signed(mm - rm, 0)}</td>
                      </>
                    )}
                    <td>{(others.get(k) ?? []).join(', ') || '—'}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        ))}
      </section>
      {a && (
        <section className="sm-sheet" aria-labelledby="alpha-title">
          <h2 id="alpha-title">Agreement of all examiners on this exercise</h2>
          <dl className="sm-figures">
            <div>
              <dt>Krippendorff’s alpha (ordinal)</dt>
              <dd data-testid="alpha-value">{a.alpha === null ? '—' : a.alpha.toFixed(3).replace('-', '−')}</dd>
            </div>
            <div>
              <dt>Examiners</dt>
              <dd>{a.examiners}</dd>
            </div>
            <div>
              <dt>Marks per examiner</dt>
              <dd>{a.units}</dd>
            </div>
          </dl>
          <p>
            Reading:{' '}
            {a.interpretation ? (
              <>
                <strong>{a.interpretation.label}</strong> <span className="sm-muted">on the scale of {shortSource(a.interpretation.source)}</span>
              </>
            ) : (
              <span className="sm-muted">{a.note}</span>
            )}
          </p>
          <p className="sm-muted">{a.method}</p>
          {view.scales.map((s) => (
            <p key={s.key} className="sm-muted">
              {shortSource(s.source)}: {s.bands.map((b) => `${b.label} from ${b.min}`).join('; ')}; {s.below} below. {s.source}
            </p>
          ))}
        </section>
      )}
      {view.attempts && (
        <section className="sm-sheet" aria-labelledby="attempts-title">
          <h2 id="attempts-title">Examiners’ attempts</h2>
          <table className="sm-table">
            <thead>
              <tr>
                <th scope="col">Examiner</th>
                <th scope="col">Status</th>
                <th scope="col" className="sm-num">
                  Mean difference
                </th>
                <th scope="col" className="sm-num">
                  Mean distance
                </th>
                <th scope="col" className="sm-num">
                  Exact
                </th>
              </tr>
            </thead>
            <tbody>
              {view.attempts.map((x) => (
                <tr key={x.examiner.id}>
                  <td>{x.examiner.name}</td>
                  <td>{x.status === 'submitted' ? 'Submitted' : 'Marking'}</td>
                  <td className="sm-num">{x.deviation ? `${signed(x.deviation.meanDifferencePercent, 1)} points` : '—'}</td>
                  <td className="sm-num">{x.deviation ? `${x.deviation.meanAbsoluteDifferencePercent.toFixed(1)} points` : '—'}</td>
                  <td className="sm-num">{x.deviation ? `${Math.round(x.deviation.exactShare * x.deviation.cells)} of ${x.deviation.cells}` : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      )}
    </div>
  );
}
