import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import { TENSION_CAUTION, type ModerationPairView } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { formatCount, formatPlainDate } from '@/lib/format';
import { useModeration } from '../api/get-moderation';
import { AgreeDialog } from '../components/AgreeDialog';
import { PairTable } from '../components/PairTable';
import { ThirdMarkerDialog } from '../components/ThirdMarkerDialog';
import '../moderation.css';

const STATUS: Record<
  ModerationPairView['status'],
  { label: string; severity: 'danger' | 'warning' | 'success' | 'info' | 'secondary' }
> = {
  open: { label: 'Flagged', severity: 'danger' },
  third_marking: { label: 'With a third marker', severity: 'warning' },
  agreed: { label: 'Marks agreed', severity: 'success' },
  third: { label: 'Settled by third marker', severity: 'success' },
  within: { label: 'Within tolerance', severity: 'info' },
  waiting: { label: 'A sheet is missing', severity: 'secondary' },
};

const BASIS: Record<string, string> = {
  single: 'one examiner',
  first: 'the first examiner’s marks',
  agreed: 'the agreed marks',
  third: 'the third marker’s marks',
};

/** Moderation of one sitting: every double-marked pair side by side, flags and their resolution. */
export function ModerationPage() {
  const { sittingId = '' } = useParams();
  const q = useModeration(sittingId);
  const [agreeing, setAgreeing] = useState<ModerationPairView | null>(null);
  const [third, setThird] = useState<ModerationPairView | null>(null);
  if (q.isPending) return <PageLoading />;
  if (q.isError) return <ErrorMessage error={q.error} what="the moderation of this sitting" />;
  const v = q.data;
  const flagged = v.pairs.filter((p) => p.status === 'open' || p.status === 'third_marking');
  return (
    <section aria-labelledby="moderation-title">
      <p className="sm-mod-breadcrumb">
        <Link to={paths.sitting.href(v.sitting.id)}>{v.sitting.title}</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="moderation-title">Moderation</h1>
          <p className="sm-page-subtitle">
            {v.sitting.title} · {formatPlainDate(v.sitting.date)} ·{' '}
            {formatCount(v.pairs.length, 'double-marked candidate')}
          </p>
        </div>
        <div className="sm-row-actions">
          <Link
            className="p-button p-component sm-mod-link-button"
            to={paths.release.href(v.sitting.id)}
          >
            Release results
          </Link>
        </div>
      </div>
      <p>
        Each pair was marked independently. A pair is flagged when one request’s scores differ by
        more than {Math.round(v.tolerance.requestShare * 100)} % of its maximum, when only one
        examiner asked a request, or when the totals differ by more than{' '}
        {Math.round(v.tolerance.totalShare * 100)} % of the total marks. Resolve a flag by agreeing
        the marks, or by asking a third examiner to mark blind.
      </p>
      {v.openFlags > 0 ? (
        <Alert severity="warn">
          {formatCount(v.openFlags, 'flag')} open. Results can be released once every flag is
          resolved.
        </Alert>
      ) : (
        <Alert severity="success">
          No flag is open: results may be released ({v.release.released} of {v.release.results}{' '}
          released so far).
        </Alert>
      )}
      <Alert severity="info">
        <strong>Freedom from tension.</strong> {TENSION_CAUTION}
      </Alert>
      {v.pairs.length === 0 && (
        <p className="sm-muted">No candidate in this sitting was double-marked.</p>
      )}
      {[...flagged, ...v.pairs.filter((p) => !flagged.includes(p))].map((p) => (
        <article
          key={p.slotId}
          className="sm-sheet sm-mod-pair"
          aria-labelledby={`pair-${p.slotId}`}
        >
          <div className="sm-mod-pair-header">
            <h2 id={`pair-${p.slotId}`}>
              {p.candidate.name} <span className="sm-muted">{p.candidate.pupilNumber}</span>{' '}
              <Tag severity={STATUS[p.status].severity} value={STATUS[p.status].label} />
            </h2>
            {(p.status === 'open' || p.status === 'third_marking') && !p.result?.released && (
              <div className="sm-row-actions">
                <Button
                  type="button"
                  label="Agree marks"
                  icon="pi pi-check"
                  onClick={() => setAgreeing(p)}
                />
                {p.status === 'open' && (
                  <Button
                    type="button"
                    severity="secondary"
                    label="Send to a third marker"
                    icon="pi pi-user-plus"
                    onClick={() => setThird(p)}
                  />
                )}
              </div>
            )}
          </div>
          {p.reasons.length > 0 && (
            <ul className="sm-mod-reasons">
              {p.reasons.map((r) => (
                <li key={r}>{r}</li>
              ))}
            </ul>
          )}
          {p.status === 'third_marking' && p.thirdExaminer && (
            <p>Waiting for {p.thirdExaminer.displayName} to submit a third sheet.</p>
          )}
          {p.agreed && (
            <p>
              Agreed by {p.agreed.by} on {formatPlainDate(p.agreed.at.slice(0, 10))}: “
              {p.agreed.reason}”
            </p>
          )}
          <PairTable pair={p} />
          {p.result && (
            <p className="sm-muted">
              Result: {p.result.total} of {p.result.outOf}, {p.result.bandLabel}, from{' '}
              {BASIS[p.result.basis]}
              {p.result.released ? ' · released' : ''}.
            </p>
          )}
        </article>
      ))}
      {agreeing && (
        <AgreeDialog sittingId={v.sitting.id} pair={agreeing} onHide={() => setAgreeing(null)} />
      )}
      {third && <ThirdMarkerDialog view={v} pair={third} onHide={() => setThird(null)} />}
    </section>
  );
}
