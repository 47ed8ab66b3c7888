import { useRef, useState } from 'react';
import { Button } from 'primereact/button';
import type { ExerciseView } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { ApiError } from '@/lib/api-client';
import { useRecordingUrl } from '../api/get-recording-url';
import { useUploadRecording } from '../api/upload-recording';

const seconds = (s: number | null) => (s === null ? '' : ` · ${Math.floor(s / 60)}:${String(Math.round(s % 60)).padStart(2, '0')}`);

/** The reference performance, played through a short-lived signed address; its author attaches it to a draft. */
export function Recording({ view }: { view: ExerciseView }) {
  const url = useRecordingUrl(view.id, view.recording !== null);
  const upload = useUploadRecording();
  const input = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<string | null>(null);
  const canUpload = view.canManage && view.status === 'draft';
  const send = async () => {
    const file = input.current?.files?.[0];
    setError(null);
    if (!file) return setError('Choose an audio or video file first.');
    try {
      await upload.mutateAsync({ id: view.id, file });
      if (input.current) input.current.value = '';
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached. Nothing was stored; try again.');
    }
  };
  return (
    <section className="sm-sheet" aria-labelledby="recording-title">
      <h2 id="recording-title">The performance</h2>
      {view.recording ? (
        <>
          {url.isError && <ErrorMessage error={url.error} what="the recording" />}
          {url.data &&
            (view.recording.contentType.startsWith('video/') ? (
              <video className="sm-audio" controls preload="metadata" src={url.data.url} aria-label="Reference performance" />
            ) : (
              <audio className="sm-audio" controls preload="metadata" src={url.data.url} aria-label="Reference performance" />
            ))}
          <p className="sm-muted">
            {view.recording.contentType}
            {seconds(view.recording.durationSeconds)} · {Math.ceil(view.recording.bytes / 1024)} kB
          </p>
        </>
      ) : (
        <p className="sm-muted">No recording is attached yet{canUpload ? ': examiners need one before you publish.' : '.'}</p>
      )}
      {canUpload && (
        <div className="sm-toolbar">
          <div className="sm-field">
            <label htmlFor="recording-file">{view.recording ? 'Replace the recording' : 'Recording (audio or video, at most 50 MB)'}</label>
            <input id="recording-file" ref={input} type="file" accept="audio/*,video/*" />
          </div>
          <Button type="button" label="Upload" icon="pi pi-upload" severity="secondary" disabled={upload.isPending} loading={upload.isPending} onClick={() => void send()} />
        </div>
      )}
      {error && <Alert severity="error">{error}</Alert>}
    </section>
  );
}
