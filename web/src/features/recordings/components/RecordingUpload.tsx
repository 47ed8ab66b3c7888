import { useId, useRef, useState } from 'react';
import { ApiError } from '@/lib/api-client';
import { Alert } from '@/components/Alert';
import { useUploadRecording } from '../api/upload-recording';
import { megabytes } from './time';

/** The length the browser reads from the file, when it can (best effort; the server reads a WAV's itself). */
function measureDuration(file: File): Promise<number | null> {
  return new Promise((resolve) => {
    const url = URL.createObjectURL(file);
    const m = document.createElement(file.type.startsWith('video/') ? 'video' : 'audio');
    const done = (v: number | null) => {
      URL.revokeObjectURL(url);
      resolve(v);
    };
    const timer = setTimeout(() => done(null), 3000);
    m.preload = 'metadata';
    m.onloadedmetadata = () => {
      clearTimeout(timer);
      done(Number.isFinite(m.duration) && m.duration > 0 ? m.duration : null);
    };
    m.onerror = () => {
      clearTimeout(timer);
      done(null);
    };
    m.src = url;
  });
}

/** Choose a file and upload it, with progress and the server's reason when it is refused. */
export function RecordingUpload({ path, maxBytes, who }: { path: string; maxBytes: number; who: string }) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const upload = useUploadRecording();
  const error = upload.error instanceof ApiError ? upload.error : upload.error ? new Error(upload.error.message) : null;

  const send = async () => {
    if (!file) return;
    setProgress(0);
    const durationSeconds = await measureDuration(file);
    upload.mutate(
      { path, file, durationSeconds, maxBytes, onProgress: setProgress },
      {
        onSuccess: () => {
          setFile(null);
          if (input.current) input.current.value = '';
        },
        onSettled: () => setProgress(null),
      },
    );
  };

  return (
    <div className="sm-rec-upload">
      <label htmlFor={id} className="sm-rec-upload__label">
        Add a recording of {who} <span className="sm-muted">(audio or video, up to {megabytes(maxBytes)})</span>
      </label>
      <div className="sm-rec-upload__row">
        <input
          ref={input}
          id={id}
          type="file"
          accept="audio/*,video/*"
          onChange={(e) => {
            upload.reset();
            setFile(e.target.files?.[0] ?? null);
          }}
        />
        <button type="button" className="sm-rec-upload__send" disabled={!file || upload.isPending} onClick={() => void send()}>
          <span className="pi pi-upload" aria-hidden="true" /> Upload
        </button>
      </div>
      {progress !== null && (
        <div className="sm-rec-upload__progress">
          <progress max={1} value={progress} aria-label="Upload progress" /> {Math.round(progress * 100)} %
        </div>
      )}
      {error && <Alert severity="error">{error.message}</Alert>}
      {upload.isSuccess && <Alert severity="success">The recording is saved.</Alert>}
    </div>
  );
}
