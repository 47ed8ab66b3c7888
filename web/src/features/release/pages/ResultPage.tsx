import { Link, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { activeRoles, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { useReport } from '../api/get-report';
import { useResult } from '../api/get-result';
import '../release.css';

const TENSION = /tension|freedom/i;

/**
 * One result: first the take-home report in plain words (strengths, next steps, the teacher's
 * note), then the marks per request and criterion with the examiners' comments.
 */
export function ResultPage() {
  const { resultId = '' } = useParams();
  const me = useCurrentUser();
  const student = activeRoles(me).includes('student');
  const report = useReport(resultId);
  const detail = useResult(resultId);
  if (report.isPending || detail.isPending) return <PageLoading />;
  if (report.isError) return <ErrorMessage error={report.error} what="this result" />;
  if (detail.isError) return <ErrorMessage error={detail.error} what="this result" />;
  const r = report.data;
  const d = detail.data;
  return (
    <section aria-labelledby="result-title">
      <p className="sm-release-breadcrumb">
        {student ? (
          <Link to={paths.myResults.href()}>My results</Link>
        ) : (
          <Link to={paths.release.href(d.sittingId)}>Release results</Link>
        )}
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="result-title">{r.sittingTitle}</h1>
          <p className="sm-page-subtitle">
            {r.studentName} · {r.date}
            {!d.releasedAt && ' · not released yet'}
          </p>
        </div>
      </div>
      <article className="sm-sheet sm-report" aria-labelledby="report-title">
        <h2 id="report-title">Take-home report</h2>
        <p className="sm-report-outcome">{r.outcome}</p>
        <p>{r.summary}</p>
        <h3>What went well</h3>
        <ul>
          {r.strengths.map((s) => (
            <li key={s}>{s}</li>
          ))}
        </ul>
        <h3>What to work on next</h3>
        <ul>
          {r.nextSteps.map((s) => (
            <li key={s}>{s}</li>
          ))}
        </ul>
        {r.teacherNote && (
          <>
            <h3>From your teacher</h3>
            <p className="sm-report-note">{r.teacherNote}</p>
          </>
        )}
        {r.caution && <Alert severity="info">{r.caution}</Alert>}
      </article>

      <section className="sm-sheet" aria-labelledby="marks-title">
        <h2 id="marks-title">Marks and comments</h2>
        <p>
          {d.total} of {d.outOf} · {d.band.label}
        </p>
        {d.overallComments.map((c) => (
          <blockquote key={c} className="sm-report-comment">
            {c}
          </blockquote>
        ))}
        <Alert severity="info">
          <strong>Freedom from tension.</strong> {d.caution}
        </Alert>
        <table className="sm-table">
          <thead>
            <tr>
              <th scope="col">Request and criterion</th>
              <th scope="col" className="sm-num">
                Mark
              </th>
              <th scope="col">Comment</th>
            </tr>
          </thead>
          {d.requests.map((q) => (
            <tbody key={q.index}>
              <tr className="sm-report-request">
                <th scope="rowgroup">
                  {q.index + 1}. {q.label}
                </th>
                <td className="sm-num">{q.asked ? '' : 'not asked'}</td>
                <td>{q.comment ?? ''}</td>
              </tr>
              {q.asked &&
                q.marks.map((m) => (
                  <tr key={m.key}>
                    <td className="sm-report-criterion">
                      {m.label}
                      {TENSION.test(m.key) && (
                        <span className="sm-muted"> (see the caution above)</span>
                      )}
                    </td>
                    <td className="sm-num">
                      {m.mark ?? '—'} / {m.maxMark}
                    </td>
                    <td />
                  </tr>
                ))}
            </tbody>
          ))}
        </table>
        {d.releasedAt && (
          <p className="sm-muted">Released on {formatPlainDate(d.releasedAt.slice(0, 10))}.</p>
        )}
      </section>
    </section>
  );
}
