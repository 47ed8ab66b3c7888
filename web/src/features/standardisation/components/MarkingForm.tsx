import { useEffect, useRef, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { Button } from 'primereact/button';
import type { ExerciseMark, ExerciseView } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { ApiError } from '@/lib/api-client';
import { useSaveAttempt } from '../api/save-attempt';
import { useSubmitAttempt } from '../api/submit-attempt';
import { MarkRow } from './MarkRow';

type Values = Record<string, number | null>;
const field = (request: number, criterion: string) => `m_${request}_${criterion}`;

function toMarks(view: ExerciseView, values: Values): ExerciseMark[] {
  const out: ExerciseMark[] = [];
  view.requests.forEach((_, r) =>
    view.rubric.criteria.forEach((c) => {
      const v = values[field(r, c.key)];
      if (typeof v === 'number') out.push({ request: r, criterion: c.key, mark: v });
    }),
  );
  return out;
}

/** An API field error's path (marks.<i>.mark or marks.<request>.<criterion>) as a form field. */
function fieldOfPath(path: string, sent: readonly ExerciseMark[]): string | null {
  const m = /^marks\.(\d+)\.(\w+)$/.exec(path);
  if (!m) return null;
  const [, a, b] = m;
  if (b === 'mark' || b === 'criterion' || b === 'request') {
    const mark = sent[Number(a)];
    return mark ? field(mark.request, mark.criterion) : null;
  }
  return field(Number(a), b!);
}

/**
 * The blind marking form: every criterion of every request with its level descriptors, one key
 * per mark like the desk. A draft is saved as marks change (nothing is lost on a reload); submit
 * needs every mark and then shows the reference.
 */
export function MarkingForm({ view }: { view: ExerciseView }) {
  const initial: Values = {};
  view.requests.forEach((_, r) => view.rubric.criteria.forEach((c) => (initial[field(r, c.key)] = null)));
  for (const m of view.myAttempt?.marks ?? []) initial[field(m.request, m.criterion)] = m.mark;
  const form = useForm<Values>({ defaultValues: initial });
  const save = useSaveAttempt();
  const submit = useSubmitAttempt();
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<'idle' | 'saving' | 'saved' | 'failed'>(view.myAttempt ? 'saved' : 'idle');
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const latest = useRef<ExerciseMark[] | null>(null);

  const showErrors = (error: unknown, sent: ExerciseMark[]) => {
    form.clearErrors();
    if (!(error instanceof ApiError)) {
      setFormError('The server could not be reached. Your marks are still here; try again.');
      return;
    }
    const unplaced: string[] = [];
    for (const d of error.fieldErrors) {
      const f = fieldOfPath(d.path, sent);
      if (f && f in initial) form.setError(f, { type: 'server', message: d.message });
      else unplaced.push(d.message);
    }
    setFormError(`${error.message}${unplaced.length ? ` ${unplaced.join(' ')}` : ''}`);
  };

  const saveDraft = async (marks: ExerciseMark[]) => {
    setSaved('saving');
    try {
      await save.mutateAsync({ id: view.id, input: { marks } });
      setSaved('saved');
    } catch (e) {
      setSaved('failed');
      showErrors(e, marks);
    }
  };

  useEffect(() => {
    const sub = form.watch((values) => {
      latest.current = toMarks(view, values as Values);
      if (timer.current) clearTimeout(timer.current);
      timer.current = setTimeout(() => void saveDraft(latest.current!), 700);
    });
    return () => {
      sub.unsubscribe();
      // A change typed in the last moments is still sent when the form goes away.
      if (timer.current) {
        clearTimeout(timer.current);
        if (latest.current) void save.mutateAsync({ id: view.id, input: { marks: latest.current } }).catch(() => undefined);
      }
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [view.id]);

  const onSubmit = form.handleSubmit(async (values) => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    const marks = toMarks(view, values);
    setFormError(null);
    try {
      await submit.mutateAsync({ id: view.id, input: { marks } });
    } catch (e) {
      showErrors(e, marks);
    }
  });

  const busy = submit.isPending;
  const total = view.requests.length * view.rubric.criteria.length;
  const given = Object.values(form.watch()).filter((v) => typeof v === 'number').length;
  return (
    <form onSubmit={(e) => void onSubmit(e)} aria-labelledby="marking-title" noValidate>
      <h2 id="marking-title">Your marks</h2>
      <p className="sm-muted">
        Click a mark, or focus a row and press its digit (arrows step, Backspace clears, Enter moves on). The reference marks and the other examiners’ marks appear once you submit.
      </p>
      {view.requests.map((r, ri) => (
        <section key={ri} className="sm-std-request" aria-label={`Request ${ri + 1}: ${r.title}`}>
          <h3>
            Request {ri + 1}: {r.title}
          </h3>
          {r.details && <p className="sm-muted">{r.details}</p>}
          {view.rubric.criteria.map((c) => (
            <Controller
              key={c.key}
              control={form.control}
              name={field(ri, c.key)}
              render={({ field: f, fieldState }) => (
                <MarkRow
                  id={`${ri}-${c.key}`}
                  criterion={c}
                  value={f.value ?? null}
                  error={fieldState.error?.message}
                  disabled={busy}
                  onSet={(v) => {
                    form.clearErrors(field(ri, c.key));
                    f.onChange(v);
                  }}
                />
              )}
            />
          ))}
        </section>
      ))}
      {formError && <Alert severity="error">{formError}</Alert>}
      <div className="sm-form-actions">
        <span className="sm-muted" role="status" aria-live="polite">
          {given} of {total} marked ·{' '}
          {saved === 'saving' ? 'Saving…' : saved === 'saved' ? 'Draft saved' : saved === 'failed' ? 'Draft not saved' : 'Nothing saved yet'}
        </span>
        <Button type="submit" label="Submit my marks" icon="pi pi-check" disabled={busy} loading={busy} />
      </div>
    </form>
  );
}
