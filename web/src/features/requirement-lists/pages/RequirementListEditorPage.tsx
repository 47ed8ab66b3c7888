import { useNavigate, useParams } from 'react-router-dom';
import type { RequirementListVersionView } from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../requirement-lists.css';
import { useCurrentUser } from '@/lib/auth';
import { notify } from '@/lib/notify';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { saveLabel, VersionEditorPage } from '@/components/VersionedDocument';
import { useCreateRequirementList } from '../api/create-requirement-list';
import { useCreateRequirementListVersion } from '../api/create-requirement-list-version';
import { useRequirementList } from '../api/get-requirement-list';
import { useRequirementListVersion } from '../api/get-requirement-list-version';
import { useRubricOptions } from '../api/get-rubric-options';
import { useUpdateRequirementListVersion } from '../api/update-requirement-list-version';
import {
  blankLine,
  RequirementListForm,
  type ListFields,
  type RubricOption,
} from '../components/RequirementListForm';

function fieldsOf(v: RequirementListVersionView): ListFields {
  return {
    name: v.name,
    grade: v.grade,
    totalMarks: v.totalMarks,
    selectionRule: { count: v.selectionRule.count, minPerKind: { ...v.selectionRule.minPerKind } },
    // The view adds the rubric's name; the body takes only its id.
    lines: v.lines.map(({ rubric: _rubric, ...l }) => ({ ...l, label: l.label ?? '' })),
  };
}

function blankList(options: RubricOption[]): ListFields {
  const scales = options.find((o) => o.kinds.includes('scale'))?.value ?? '';
  return {
    name: '',
    grade: '',
    totalMarks: 30,
    selectionRule: { count: 2, minPerKind: { scale: 1 } },
    lines: [blankLine('scale', scales)],
  };
}

export function NewRequirementListPage() {
  const navigate = useNavigate();
  const me = useCurrentUser();
  const rubrics = useRubricOptions();
  const create = useCreateRequirementList();
  if (rubrics.isError)
    return <ErrorMessage error={rubrics.error} what="the rubrics to mark with" />;
  if (!rubrics.data) return <PageLoading />;
  return (
    <VersionEditorPage
      crumbs={[{ label: 'Requirement lists', href: paths.requirementLists.href() }]}
      newPage={{
        title: 'New requirement list',
        subtitle: 'Saved as a draft (version 1); publish it when sittings may use it.',
      }}
      readyWhen="when sittings may use it"
      notices={
        rubrics.data.length === 0 && (
          <Alert severity="warn">
            There are no rubrics yet. Create one first: every line is marked with a rubric.
          </Alert>
        )
      }
    >
      <RequirementListForm
        defaultValues={blankList(rubrics.data)}
        rubricOptions={rubrics.data}
        convention={me.noteNames}
        submitLabel={saveLabel()}
        onCancel={() => navigate(paths.requirementLists.href())}
        onSave={async (body) => {
          const v = await create.mutateAsync(body);
          notify({ severity: 'success', summary: `“${v.name}” was saved as a draft.` });
          navigate(paths.requirementList.href(v.listId, v.version));
        }}
      />
    </VersionEditorPage>
  );
}

export function EditRequirementListPage() {
  const { listId = '' } = useParams();
  const navigate = useNavigate();
  const me = useCurrentUser();
  const list = useRequirementList(listId);
  const latest = useRequirementListVersion(list.data?.latest.id);
  const rubrics = useRubricOptions();
  const update = useUpdateRequirementListVersion();
  const createVersion = useCreateRequirementListVersion();

  const error = list.error ?? latest.error ?? rubrics.error;
  if (error) return <ErrorMessage error={error} what="this requirement list" />;
  if (!latest.data || !rubrics.data) return <PageLoading />;
  const v = latest.data;
  return (
    <VersionEditorPage
      crumbs={[
        { label: 'Requirement lists', href: paths.requirementLists.href() },
        { label: v.name, href: paths.requirementList.href(listId) },
      ]}
      editing={v}
      readyWhen="when sittings may use it"
    >
      <RequirementListForm
        key={v.id}
        defaultValues={fieldsOf(v)}
        rubricOptions={rubrics.data}
        convention={me.noteNames}
        submitLabel={saveLabel(v)}
        onCancel={() => navigate(paths.requirementList.href(listId, v.version))}
        onSave={async (body) => {
          const saved =
            v.status === 'draft'
              ? await update.mutateAsync({ id: v.id, body })
              : await createVersion.mutateAsync({ listId, body });
          notify({
            severity: 'success',
            summary: `Version ${saved.version} was saved as a draft.`,
          });
          navigate(paths.requirementList.href(listId, saved.version));
        }}
      />
    </VersionEditorPage>
  );
}
