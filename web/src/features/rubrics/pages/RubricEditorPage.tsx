import { useId } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { RubricVersionView } from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../rubrics.css';
import { notify } from '@/lib/notify';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useCreateRubric } from '../api/create-rubric';
import { useCreateRubricVersion } from '../api/create-rubric-version';
import { useRubric } from '../api/get-rubric';
import { useRubricVersion } from '../api/get-rubric-version';
import { useUpdateRubricVersion } from '../api/update-rubric-version';
import { blankRubric, RubricForm, type RubricFields } from '../components/RubricForm';

function fieldsOf(v: RubricVersionView): RubricFields {
  return {
    name: v.name,
    kinds: [...v.kinds],
    criteria: v.criteria.map((c) => ({
      ...c,
      description: c.description ?? '',
      descriptors: c.descriptors.map((d) => ({ ...d })),
    })),
  };
}

/** A new rubric. */
export function NewRubricPage() {
  const id = useId();
  const navigate = useNavigate();
  const create = useCreateRubric();
  return (
    <section aria-labelledby={`${id}-title`}>
      <p className="sm-breadcrumb">
        <Link to={paths.rubrics.href()}>Rubrics</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>New rubric</h1>
          <p className="sm-page-subtitle">
            Saved as a draft (version 1); publish it when it is ready for marking.
          </p>
        </div>
      </div>
      <RubricForm
        defaultValues={blankRubric()}
        submitLabel="Save draft"
        onCancel={() => navigate(paths.rubrics.href())}
        onSave={async (body) => {
          const v = await create.mutateAsync(body);
          notify({ severity: 'success', summary: `“${v.name}” was saved as a draft.` });
          navigate(paths.rubric.href(v.rubricId, v.version));
        }}
      />
    </section>
  );
}

/**
 * Edits a rubric's latest version: a draft changes in place; a published version stays as it
 * is and the edit is saved as the next version, a draft.
 */
export function EditRubricPage() {
  const id = useId();
  const { rubricId = '' } = useParams();
  const navigate = useNavigate();
  const rubric = useRubric(rubricId);
  const latest = useRubricVersion(rubric.data?.latest.id);
  const update = useUpdateRubricVersion();
  const createVersion = useCreateRubricVersion();

  if (rubric.isError) return <ErrorMessage error={rubric.error} what="this rubric" />;
  if (latest.isError) return <ErrorMessage error={latest.error} what="this rubric" />;
  if (!latest.data) return <PageLoading />;
  const v = latest.data;
  const isDraft = v.status === 'draft';
  const back = () => navigate(paths.rubric.href(rubricId, v.version));

  return (
    <section aria-labelledby={`${id}-title`}>
      <p className="sm-breadcrumb">
        <Link to={paths.rubrics.href()}>Rubrics</Link> /{' '}
        <Link to={paths.rubric.href(rubricId)}>{v.name}</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>
            {isDraft ? `Edit draft version ${v.version}` : `New version of “${v.name}”`}
          </h1>
        </div>
      </div>
      {!isDraft && (
        <Alert severity="info">
          Version {v.version} is published and stays exactly as it is. Saving makes version{' '}
          {v.version + 1}, a draft, which you publish when it is ready.
        </Alert>
      )}
      <RubricForm
        key={v.id}
        defaultValues={fieldsOf(v)}
        submitLabel={isDraft ? 'Save draft' : `Save as version ${v.version + 1}`}
        onCancel={back}
        onSave={async (body) => {
          const saved = isDraft
            ? await update.mutateAsync({ id: v.id, body })
            : await createVersion.mutateAsync({ rubricId, body });
          notify({
            severity: 'success',
            summary: `Version ${saved.version} was saved as a draft.`,
          });
          navigate(paths.rubric.href(rubricId, saved.version));
        }}
      />
    </section>
  );
}
