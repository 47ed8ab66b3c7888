import { useNavigate, useParams } from 'react-router-dom';
import type { RubricVersionView } from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../rubrics.css';
import { notify } from '@/lib/notify';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { saveLabel, VersionEditorPage } from '@/components/VersionedDocument';
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
  const navigate = useNavigate();
  const create = useCreateRubric();
  return (
    <VersionEditorPage
      crumbs={[{ label: 'Rubrics', href: paths.rubrics.href() }]}
      newPage={{
        title: 'New rubric',
        subtitle: 'Saved as a draft (version 1); publish it when it is ready for marking.',
      }}
      readyWhen="when it is ready"
    >
      <RubricForm
        defaultValues={blankRubric()}
        submitLabel={saveLabel()}
        onCancel={() => navigate(paths.rubrics.href())}
        onSave={async (body) => {
          const v = await create.mutateAsync(body);
          notify({ severity: 'success', summary: `“${v.name}” was saved as a draft.` });
          navigate(paths.rubric.href(v.rubricId, v.version));
        }}
      />
    </VersionEditorPage>
  );
}

/**
 * Edits a rubric's latest version: a draft changes in place; a published version stays as it
 * is and the edit is saved as the next version, a draft.
 */
export function EditRubricPage() {
  const { rubricId = '' } = useParams();
  const navigate = useNavigate();
  const rubric = useRubric(rubricId);
  const latest = useRubricVersion(rubric.data?.latest.id);
  const update = useUpdateRubricVersion();
  const createVersion = useCreateRubricVersion();

  const error = rubric.error ?? latest.error;
  if (error) return <ErrorMessage error={error} what="this rubric" />;
  if (!latest.data) return <PageLoading />;
  const v = latest.data;

  return (
    <VersionEditorPage
      crumbs={[
        { label: 'Rubrics', href: paths.rubrics.href() },
        { label: v.name, href: paths.rubric.href(rubricId) },
      ]}
      editing={v}
      readyWhen="when it is ready"
    >
      <RubricForm
        key={v.id}
        defaultValues={fieldsOf(v)}
        submitLabel={saveLabel(v)}
        onCancel={() => navigate(paths.rubric.href(rubricId, v.version))}
        onSave={async (body) => {
          const saved =
            v.status === 'draft'
              ? await update.mutateAsync({ id: v.id, body })
              : await createVersion.mutateAsync({ rubricId, body });
          notify({
            severity: 'success',
            summary: `Version ${saved.version} was saved as a draft.`,
          });
          navigate(paths.rubric.href(rubricId, saved.version));
        }}
      />
    </VersionEditorPage>
  );
}
