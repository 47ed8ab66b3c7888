import { useState } from 'react';
import { Button } from 'primereact/button';
import type { ExerciseMark, ExerciseView } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { ApiError } from '@/lib/api-client';
import { usePublishExercise, useUpdateExercise } from '../api/update-exercise';
import { MarkRow } from './MarkRow';

const key = (r: number, c: string) => `${r}:${c}`;

/** A draft's reference marks, set by its author or an admin, then publishing. */
export function ReferenceEditor({ view }: { view: ExerciseView }) {
  const [marks, setMarks] = useState(() => new Map((view.referenceMarks ?? []).map((m) => [key(m.request, m.criterion), m.mark])));
  const [message, setMessage] = useState<{ severity: 'error' | 'success'; text: string } | null>(null);
  const update = useUpdateExercise();
  const publish = usePublishExercise();
  const list = (): ExerciseMark[] =>
    [...marks.entries()].map(([k, mark]) => {
      const [r, criterion] = k.split(':') as [string, string];
      return { request: Number(r), criterion, mark };
    });
  const explain = (e: unknown) =>
    setMessage({
      severity: 'error',
      text: e instanceof ApiError ? `${e.message}${e.fieldErrors.length ? ` ${e.fieldErrors.map((d) => d.message).join(' ')}` : ''}` : 'The server could not be reached. Nothing was lost; try again.',
    });
  const save = async () => {
    setMessage(null);
    try {
      await update.mutateAsync({ id: view.id, changes: { referenceMarks: list() } });
      setMessage({ severity: 'success', text: 'Reference marks saved.' });
    } catch (e) {
      explain(e);
    }
  };
  const doPublish = async () => {
    setMessage(null);
    try {
      await update.mutateAsync({ id: view.id, changes: { referenceMarks: list() } });
      await publish.mutateAsync(view.id);
    } catch (e) {
      explain(e);
    }
  };
  const busy = update.isPending || publish.isPending;
  return (
    <section className="sm-sheet" aria-labelledby="reference-edit-title">
      <h2 id="reference-edit-title">Reference marks</h2>
      <p className="sm-muted">The marks the exercise’s performance deserves, agreed before examiners see it. Examiners never see them before they submit their own.</p>
      {view.requests.map((r, ri) => (
        <div key={ri} className="sm-std-request">
          <h3>
            Request {ri + 1}: {r.title}
          </h3>
          {view.rubric.criteria.map((c) => (
            <MarkRow
              key={c.key}
              id={`ref-${ri}-${c.key}`}
              criterion={c}
              value={marks.get(key(ri, c.key)) ?? null}
              error={undefined}
              disabled={busy}
              onSet={(v) =>
                setMarks((prev) => {
                  const next = new Map(prev);
                  if (v === null) next.delete(key(ri, c.key));
                  else next.set(key(ri, c.key), v);
                  return next;
                })
              }
            />
          ))}
        </div>
      ))}
      {message && <Alert severity={message.severity}>{message.text}</Alert>}
      <div className="sm-form-actions">
        <Button type="button" label="Save reference marks" severity="secondary" disabled={busy} onClick={() => void save()} />
        <Button type="button" label="Publish to examiners" icon="pi pi-send" disabled={busy} onClick={() => void doPublish()} />
      </div>
    </section>
  );
}
