import { useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate } from 'react-router-dom';
import { Button } from 'primereact/button';
import { createExerciseSchema, type CreateExerciseInput } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import { paths } from '@/config/paths';
import { applyApiErrors } from '@/lib/form-errors';
import { useCreateExercise } from '../api/create-exercise';
import { usePublishedRubrics } from '../api/get-published-rubrics';
import '../standardisation.css';

type Fields = CreateExerciseInput;
const FIELDS = ['title', 'instructions', 'rubricVersionId', 'requests', 'dueOn'] as const;

/** A new exercise as a draft: what was performed and the rubric; marks and recording come next. */
export function NewExercisePage() {
  const rubrics = usePublishedRubrics();
  const create = useCreateExercise();
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, control, handleSubmit, setError, formState: { errors } } = useForm<Fields>({
    resolver: zodResolver(createExerciseSchema) as never,
    defaultValues: { title: '', instructions: '', rubricVersionId: '', requests: [{ title: '', details: '' }], dueOn: null, referenceMarks: [] },
  });
  const requests = useFieldArray({ control, name: 'requests' });
  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const v = await create.mutateAsync({ ...values, dueOn: values.dueOn || null });
      navigate(paths.standardisationExercise.href(v.id));
    } catch (e) {
      setFormError(applyApiErrors(e, setError, FIELDS));
    }
  });
  return (
    <section aria-labelledby="new-ex-title">
      <p className="sm-breadcrumb">
        <Link to={paths.standardisation.href()}>Standardisation</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="new-ex-title">New standardisation exercise</h1>
          <p className="sm-page-subtitle">Say what the performer was asked to play and which rubric examiners mark it on. The reference marks and the recording come next, before you publish.</p>
        </div>
      </div>
      <form className="sm-form sm-sheet" onSubmit={(e) => void onSubmit(e)} noValidate>
        <div className="sm-field">
          <label htmlFor="ex-title">Title</label>
          <input id="ex-title" className="p-inputtext" aria-describedby="ex-title-error" {...register('title')} />
          <FieldError id="ex-title-error" message={errors.title?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor="ex-rubric">Rubric</label>
          <select id="ex-rubric" className="p-inputtext" aria-describedby="ex-rubric-error" {...register('rubricVersionId')}>
            <option value="">Choose a published rubric…</option>
            {(rubrics.data ?? []).map((r) => (
              <option key={r.id} value={r.published!.id}>
                {r.published!.name} (version {r.published!.version})
              </option>
            ))}
          </select>
          <FieldError id="ex-rubric-error" message={errors.rubricVersionId?.message} />
        </div>
        <fieldset className="sm-fieldset">
          <legend>Requests performed on the recording</legend>
          {requests.fields.map((f, i) => (
            <div key={f.id} className="sm-toolbar">
              <div className="sm-field">
                <label htmlFor={`ex-req-${i}`}>Request {i + 1}</label>
                <input id={`ex-req-${i}`} className="p-inputtext" placeholder="E major scale" aria-describedby={`ex-req-${i}-error`} {...register(`requests.${i}.title`)} />
                <FieldError id={`ex-req-${i}-error`} message={errors.requests?.[i]?.title?.message} />
              </div>
              <div className="sm-field sm-field-grow">
                <label htmlFor={`ex-req-${i}-details`}>As asked</label>
                <input id={`ex-req-${i}-details`} className="p-inputtext" placeholder="hands together, two octaves, legato" {...register(`requests.${i}.details`)} />
              </div>
              {requests.fields.length > 1 && <Button type="button" label="Remove" severity="secondary" text onClick={() => requests.remove(i)} />}
            </div>
          ))}
          {requests.fields.length < 6 && <Button type="button" label="Add a request" icon="pi pi-plus" severity="secondary" onClick={() => requests.append({ title: '', details: '' })} />}
          <FieldError id="ex-requests-error" message={errors.requests?.message ?? errors.requests?.root?.message} />
        </fieldset>
        <div className="sm-field">
          <label htmlFor="ex-due">Mark by (optional)</label>
          <input id="ex-due" type="date" className="p-inputtext" aria-describedby="ex-due-error" {...register('dueOn', { setValueAs: (v: string) => v || null })} />
          <FieldError id="ex-due-error" message={errors.dueOn?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor="ex-instructions">Instructions for examiners (optional)</label>
          <textarea id="ex-instructions" className="p-inputtext" rows={3} {...register('instructions')} />
        </div>
        {formError && <Alert severity="error">{formError}</Alert>}
        <div className="sm-form-actions">
          <Button type="submit" label="Create the draft" disabled={create.isPending} loading={create.isPending} />
        </div>
      </form>
    </section>
  );
}
