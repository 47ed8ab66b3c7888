import type { QueueSnapshot } from '../api/save-queue';

/** Always visible: saved, saving, or offline with the number of changes waiting. */
export function SaveStatus({ snapshot }: { snapshot: QueueSnapshot }) {
  const text =
    snapshot.state === 'offline'
      ? `Offline — ${snapshot.pending} change${snapshot.pending === 1 ? '' : 's'} queued`
      : snapshot.state === 'saving'
        ? `Saving… (${snapshot.pending})`
        : 'All changes saved';
  return (
    <p
      className={`sm-desk-status sm-desk-status--${snapshot.state}`}
      role="status"
      aria-live="polite"
      data-testid="save-status"
    >
      {text}
    </p>
  );
}
