import { ApiError } from '@/lib/api-client';
import { Alert } from '@/components/Alert';
import { formatPlainDate } from '@/lib/format';
import { useDeleteRecording } from '../api/delete-recording';
import { useSlotRecordings } from '../api/get-slot-recordings';
import { RecordingPlayer } from './RecordingPlayer';
import { RecordingUpload } from './RecordingUpload';
import { clock, megabytes } from './time';
import '../recordings.css';

/**
 * A slot's recordings with players, and the upload control for those who may add one.
 * On the marking desk (`variant="desk"`) it shows only when there is something to play.
 */
export function SlotRecordingsPanel({ slotId, candidate, variant = 'page' }: { slotId: string; candidate: string; variant?: 'desk' | 'page' }) {
  const q = useSlotRecordings(slotId);
  const del = useDeleteRecording();
  if (q.isPending) return variant === 'desk' ? null : <p className="sm-muted">Loading recordings…</p>;
  if (q.isError) {
    if (variant === 'desk') return null;
    const e = q.error;
    return <p className="sm-muted">{e instanceof ApiError && e.status === 403 ? e.message : 'The recordings could not be loaded.'}</p>;
  }
  const v = q.data;
  if (variant === 'desk' && v.items.length === 0) return null;
  return (
    <section className={`sm-recordings sm-recordings--${variant}`} aria-label={`Recordings of ${candidate}`}>
      {variant === 'desk' && <h2 className="sm-recordings__title">Recording{v.items.length > 1 ? 's' : ''}</h2>}
      {v.items.length === 0 && <p className="sm-muted">No recording yet.</p>}
      <ul className="sm-recordings__list">
        {v.items.map((r, i) => {
          const label = `recording ${i + 1} of ${candidate}`;
          return (
            <li key={r.id} className="sm-recordings__item">
              <div className="sm-recordings__meta">
                <strong>Recording {i + 1}</strong>
                <span className="sm-muted">
                  {r.kind === 'video' ? 'Video' : 'Audio'}
                  {r.durationSeconds != null && ` · ${clock(r.durationSeconds)}`} · {megabytes(r.sizeBytes)}
                  {r.uploadedBy && ` · added by ${r.uploadedBy}`} · {formatPlainDate(r.createdAt.slice(0, 10), 'short')}
                  {variant === 'page' && ` · kept until ${formatPlainDate(r.expiresAt.slice(0, 10), 'short')}`}
                </span>
                {r.canDelete && variant === 'page' && (
                  <button
                    type="button"
                    className="sm-recordings__delete"
                    disabled={del.isPending}
                    onClick={() => {
                      if (window.confirm(`Delete recording ${i + 1} of ${candidate}? The file is removed for good.`)) del.mutate(r.id);
                    }}
                  >
                    Delete
                  </button>
                )}
              </div>
              <RecordingPlayer recording={r} label={label} />
            </li>
          );
        })}
      </ul>
      {del.error && <Alert severity="error">{del.error.message}</Alert>}
      {variant === 'page' &&
        (v.canUpload ? (
          <RecordingUpload path={`/slots/${encodeURIComponent(slotId)}/recordings`} maxBytes={v.maxBytes} who={candidate} />
        ) : (
          v.uploadBlockedReason && <Alert severity="info">{v.uploadBlockedReason}</Alert>
        ))}
    </section>
  );
}
