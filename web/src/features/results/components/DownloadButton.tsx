import { useRef, useState } from 'react';
import { Button } from 'primereact/button';
import { ProgressBar } from 'primereact/progressbar';
import type { QueryValue } from '@/lib/api-client';
import { LOCALE } from '@/lib/format';
import { downloadFile, type DownloadProgress } from '../api/download-file';

const n = (x: number) => new Intl.NumberFormat(LOCALE).format(x);
const size = (b: number) => (b < 1024 * 1024 ? `${n(Math.ceil(b / 1024))} KB` : `${(b / 1024 / 1024).toFixed(1)} MB`);

interface Props {
  label: string;
  icon: string;
  path: string;
  query?: Record<string, QueryValue>;
  fallbackName: string;
  /** CSV: count rows as they arrive and offer to stop. */
  csv?: boolean;
}

/** A download from the API with its progress shown while it streams (rows and bytes for CSV). */
export function DownloadButton({ label, icon, path, query, fallbackName, csv = false }: Props) {
  const [progress, setProgress] = useState<DownloadProgress | null>(null);
  const [running, setRunning] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const abort = useRef<AbortController | null>(null);

  const start = async () => {
    setError(null);
    setDone(null);
    setProgress(null);
    setRunning(true);
    abort.current = new AbortController();
    try {
      const p = await downloadFile(path, { query, fallbackName, onProgress: setProgress, signal: abort.current.signal });
      setDone(csv ? `Saved ${n(p.rows)} rows (${size(p.bytes)}).` : `Saved (${size(p.bytes)}).`);
    } catch (e) {
      if (e instanceof DOMException && e.name === 'AbortError') setError('Stopped: nothing was saved.');
      else setError(e instanceof Error ? e.message : 'The download failed.');
    } finally {
      setRunning(false);
      abort.current = null;
    }
  };

  const share = progress?.expectedRows ? Math.min(100, Math.round((progress.rows / progress.expectedRows) * 100)) : null;
  return (
    <div className="sm-download">
      <Button type="button" label={label} icon={icon} severity="secondary" outlined onClick={start} disabled={running} />
      {running && (
        <div className="sm-download-progress" role="status" aria-live="polite">
          {share !== null ? (
            <ProgressBar value={share} aria-label={`${label}: ${share} %`} />
          ) : (
            <ProgressBar mode="indeterminate" aria-label={`${label}: in progress`} style={{ height: '0.4rem' }} />
          )}
          <span>
            {progress
              ? csv
                ? `${n(progress.rows)}${progress.expectedRows !== null ? ` of ${n(progress.expectedRows)}` : ''} rows · ${size(progress.bytes)}`
                : size(progress.bytes)
              : 'Starting…'}
          </span>
          {csv && <Button type="button" label="Stop" link size="small" onClick={() => abort.current?.abort()} />}
        </div>
      )}
      {!running && done && <span className="sm-download-done" role="status">{done}</span>}
      {!running && error && <span className="sm-field-error" role="alert">{error}</span>}
    </div>
  );
}
