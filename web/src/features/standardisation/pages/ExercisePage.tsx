import { Link, useParams } from 'react-router-dom';
import { Tag } from 'primereact/tag';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { paths } from '@/config/paths';
import { formatPlainDate } from '@/lib/format';
import { useExercise } from '../api/get-exercise';
import { MarkingForm } from '../components/MarkingForm';
import { Recording } from '../components/Recording';
import { ReferenceEditor } from '../components/ReferenceEditor';
import { Results } from '../components/Results';
import '../standardisation.css';

export function ExercisePage() {
  const { exerciseId = '' } = useParams();
  const exercise = useExercise(exerciseId);
  if (exercise.isPending) return <PageLoading />;
  if (exercise.isError) return <ErrorMessage error={exercise.error} what="the exercise" />;
  const v = exercise.data;
  const submitted = v.myAttempt?.status === 'submitted';
  return (
    <section aria-labelledby="exercise-title">
      <p className="sm-breadcrumb">
        <Link to={paths.standardisation.href()}>Standardisation</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="exercise-title">
            {v.title} {v.status === 'draft' && <Tag severity="warning" value="Draft" />}
          </h1>
          <p className="sm-page-subtitle">
            {v.rubric.name} (version {v.rubric.version}) · {v.requests.length} request{v.requests.length === 1 ? '' : 's'}
            {v.dueOn && <> · mark by {formatPlainDate(v.dueOn)}</>}
            {v.createdBy && <> · set by {v.createdBy}</>}
          </p>
        </div>
      </div>
      {v.instructions && <p>{v.instructions}</p>}
      <Recording view={v} />
      {submitted && (
        <Alert severity="success">
          Your marks are submitted{v.myAttempt?.submittedAt ? ` (${formatPlainDate(v.myAttempt.submittedAt.slice(0, 10))})` : ''}. Below: the reference and how you compare.
        </Alert>
      )}
      {v.canAttempt && !submitted && <MarkingForm view={v} />}
      {!v.canAttempt && !v.referenceMarks && <p className="sm-muted">This exercise is for examiners to mark.</p>}
      {v.canManage && v.canAttempt === false && v.status === 'published' && (
        <p className="sm-muted">You can see the reference marks, so you do not mark this exercise yourself.</p>
      )}
      {v.canManage && v.status === 'draft' && <ReferenceEditor view={v} />}
      {v.referenceMarks && v.status === 'published' && <Results view={v} />}
    </section>
  );
}
