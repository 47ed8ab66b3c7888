import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { ProgressView } from '@stavemark/shared';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { paths } from '@/config/paths';
import { useToday } from '@/features/today/api/get-today';
import { activeRoles, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { useProgress } from '../api/get-progress';
import { ChartWithTable } from '../components/ChartWithTable';
import { CriteriaChart, OverallChart, SlipChart } from '../components/charts';
import { HealthCaution } from '../components/HealthCaution';
import '../progress.css';

const one = (n: number) => (Math.round(n * 10) / 10).toFixed(1);
const signed = (n: number) => `${n >= 0 ? '+' : '−'}${one(Math.abs(n))}`;
const outcomeLabel: Record<string, string> = { completed: 'Completed', absent: 'Absent', withdrawn: 'Withdrawn', incomplete: 'Incomplete' };

/** The signed-in student's own year. */
export function MyProgressPage() {
  const today = useToday();
  if (today.isPending) return <PageLoading label="Loading your progress…" />;
  if (today.isError) return <ErrorMessage error={today.error} what="your progress" />;
  if (!today.data.student) return <p className="sm-muted">There is no student record for you in this organisation.</p>;
  return <Progress studentId={today.data.student.id} own />;
}

/** A student's year, for their teachers and admins (and the student, by the same link). */
export function StudentProgressPage() {
  const { studentId } = useParams();
  return <Progress studentId={studentId!} own={false} />;
}

function Progress({ studentId, own }: { studentId: string; own: boolean }) {
  const q = useProgress(studentId);
  const roles = activeRoles(useCurrentUser());
  if (q.isPending) return <PageLoading label="Loading the year…" />;
  if (q.isError) return <ErrorMessage error={q.error} what="this student's progress" />;
  const staff = roles.includes('teacher') || roles.includes('admin');
  return <ProgressContent v={q.data} own={own} staff={staff} />;
}

export function ProgressContent({ v, own, staff }: { v: ProgressView; own: boolean; staff: boolean }) {
  const criteria = useMemo(() => {
    const seen = new Map<string, string>();
    for (const s of v.sittings) for (const c of s.result?.criteria ?? []) if (!seen.has(c.key)) seen.set(c.key, c.label);
    return [...seen].map(([key, label]) => ({ key, label }));
  }, [v]);
  const completed = v.sittings.filter((s) => s.result);
  const commented = [...v.sittings].reverse().filter((s) => s.comments.length > 0);

  return (
    <section aria-labelledby="progress-title" className="sm-progress">
      <div className="sm-page-header">
        <div>
          <h1 id="progress-title">{own ? 'Your progress' : `Progress: ${v.student.name}`}</h1>
          <p className="sm-page-subtitle">
            {v.student.name}
            {v.student.grade !== null ? ` · grade ${v.student.grade}` : ''} · {formatPlainDate(v.from)} to {formatPlainDate(v.to)}
          </p>
        </div>
        {staff && !own && (
          <Link to={paths.attention.href()} className="sm-muted">
            Attention list
          </Link>
        )}
      </div>

      <section className="sm-sheet" aria-labelledby="progress-summary">
        <h2 id="progress-summary">The year in brief</h2>
        {completed.length === 0 ? (
          <p className="sm-muted">No marked sittings in the last twelve months yet.</p>
        ) : (
          <>
            <ul className="sm-line-list">
              {v.lines.map((l, i) => (
                <li key={`${l.lineageId}-${l.grade}-${i}`}>
                  <strong>
                    {l.listName} (grade {l.grade})
                  </strong>
                  , {formatPlainDate(l.from, 'short')} to {formatPlainDate(l.to, 'short')}: {l.n} marked sitting{l.n === 1 ? '' : 's'}
                  {l.firstToLatest && l.n > 1 && (
                    <>
                      ; from {one(l.firstToLatest.first)} % to {one(l.firstToLatest.latest)} % ({signed(l.firstToLatest.change)} points)
                    </>
                  )}
                  {l.slopePer30Days !== null && (
                    <>
                      ; trend {signed(l.slopePer30Days)} points per 30 days
                      {l.standardError !== null && <> (standard error {one(l.standardError)})</>}
                    </>
                  )}
                  .
                </li>
              ))}
            </ul>
            {v.lines.length > 1 && (
              <p className="sm-muted">A change of grade or requirement list starts a new line: results on different lists are not compared.</p>
            )}
            <p>
              {v.percentile === null ? null : v.percentile.value === null ? (
                <span className="sm-muted">
                  Standing in the grade is not shown: fewer than 10 students of grade {v.percentile.grade} have a result on this list ({v.percentile.students}).
                </span>
              ) : (
                <>
                  Latest result: percentile <strong>{Math.round(v.percentile.value)}</strong> among {v.percentile.students} grade {v.percentile.grade} students on this list.
                </>
              )}
            </p>
          </>
        )}
      </section>

      <ChartWithTable
        title="Overall percentage"
        description="Each marked sitting; absent sittings are named on the axis and have no point."
        chart={<OverallChart v={v} />}
        table={
          <table className="sm-table">
            <caption className="sm-visually-hidden">Overall percentage per sitting</caption>
            <thead>
              <tr>
                <th scope="col">Date</th>
                <th scope="col">Sitting</th>
                <th scope="col">Outcome</th>
                <th scope="col" className="sm-num">Marks</th>
                <th scope="col" className="sm-num">Percentage</th>
                <th scope="col">Band</th>
              </tr>
            </thead>
            <tbody>
              {v.sittings.map((s) => (
                <tr key={s.slotId}>
                  <td>{formatPlainDate(s.date, 'short')}</td>
                  <td>{staff ? <Link to={paths.sitting.href(s.sittingId)}>{s.title}</Link> : s.title}</td>
                  <td>{outcomeLabel[s.outcome] ?? s.outcome}</td>
                  <td className="sm-num">{s.result ? `${s.result.total} / ${s.result.outOf}` : '—'}</td>
                  <td className="sm-num">{s.result ? `${one(s.result.percentage)} %` : '—'}</td>
                  <td>{s.result?.band.label ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        }
      />

      <ChartWithTable
        title="Each criterion"
        description="Each criterion as a share of its maximum, over the requests that used it."
        chart={<CriteriaChart v={v} criteria={criteria} />}
        table={
          <div className="sm-table-scroll">
            <table className="sm-table">
              <caption className="sm-visually-hidden">Each criterion per sitting</caption>
              <thead>
                <tr>
                  <th scope="col">Date</th>
                  {criteria.map((c) => (
                    <th key={c.key} scope="col" className="sm-num">
                      {c.label}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {v.sittings.map((s) => (
                  <tr key={s.slotId}>
                    <td>{formatPlainDate(s.date, 'short')}</td>
                    {s.result
                      ? criteria.map((c) => {
                          const f = s.result!.criteria.find((x) => x.key === c.key)?.fraction;
                          return (
                            <td key={c.key} className="sm-num">
                              {f === undefined ? '—' : `${Math.round(f * 100)} %`}
                            </td>
                          );
                        })
                      : <td colSpan={criteria.length}>{outcomeLabel[s.outcome] ?? s.outcome}</td>}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        }
      />
      {v.tensionCaution && <HealthCaution text={v.tensionCaution} />}

      <ChartWithTable
        title="Fingering slips"
        description="Slips flagged by the examiner per 100 notes of scales and arpeggios played (both hands together count twice)."
        chart={<SlipChart v={v} />}
        table={
          <table className="sm-table">
            <caption className="sm-visually-hidden">Fingering slips per sitting</caption>
            <thead>
              <tr>
                <th scope="col">Date</th>
                <th scope="col" className="sm-num">Slips</th>
                <th scope="col" className="sm-num">Notes played</th>
                <th scope="col" className="sm-num">Per 100 notes</th>
              </tr>
            </thead>
            <tbody>
              {v.sittings.map((s) => (
                <tr key={s.slotId}>
                  <td>{formatPlainDate(s.date, 'short')}</td>
                  <td className="sm-num">{s.result ? s.result.slips : '—'}</td>
                  <td className="sm-num">{s.result?.notesPlayed ?? '—'}</td>
                  <td className="sm-num">{s.result?.slipRate != null ? one(s.result.slipRate) : outcomeLabel[s.outcome] === 'Completed' ? '—' : outcomeLabel[s.outcome]}</td>
                </tr>
              ))}
            </tbody>
          </table>
        }
      />

      <section className="sm-sheet" aria-labelledby="progress-comments">
        <h2 id="progress-comments">Examiners’ comments</h2>
        {commented.length === 0 ? (
          <p className="sm-muted">No comments yet.</p>
        ) : (
          <ol className="sm-timeline">
            {commented.map((s) => (
              <li key={s.slotId} id={`sitting-${s.sittingId}`}>
                <h3>
                  <time dateTime={s.date}>{formatPlainDate(s.date)}</time> · {s.title}
                  {s.result && <span className="sm-muted"> · {s.result.band.label}</span>}
                </h3>
                <ul>
                  {s.comments.map((c, i) => (
                    <li key={i}>
                      <span className="sm-comment-who">
                        {c.examiner}
                        {c.about !== 'overall' ? `, on ${c.about}` : ''}:
                      </span>{' '}
                      {c.text}
                    </li>
                  ))}
                </ul>
              </li>
            ))}
          </ol>
        )}
      </section>
    </section>
  );
}
