import { ProgressSpinner } from 'primereact/progressspinner';

export function PageLoading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div className="sm-loading" role="status" aria-live="polite">
      <ProgressSpinner
        style={{ width: '2rem', height: '2rem' }}
        strokeWidth="5"
        aria-hidden="true"
      />
      <span>{label}</span>
    </div>
  );
}
