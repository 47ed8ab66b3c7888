import { useParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { paths } from '@/config/paths';
import '../rubrics.css';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { formatDateInZone } from '@/lib/format';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useSelectedVersion, VersionedDocumentPage } from '@/components/VersionedDocument';
import { useRubric } from '../api/get-rubric';
import { useRubricVersion } from '../api/get-rubric-version';
import { usePublishRubricVersion } from '../api/publish-rubric-version';
import { useExportRubricVersion } from '../api/export-rubric-version';
import { CriteriaView } from '../components/CriteriaView';
import { KIND_LABELS } from '../components/labels';

export function RubricPage() {
  const { rubricId = '' } = useParams();
  const me = useCurrentUser();
  const timeZone = activeMembership(me)?.timeZone ?? 'UTC';
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  const rubric = useRubric(rubricId);
  const versions = rubric.data?.versions ?? [];
  const { selected, select } = useSelectedVersion(versions);
  const version = useRubricVersion(selected?.id);
  const publish = usePublishRubricVersion();
  const exportFile = useExportRubricVersion();

  if (rubric.isPending) return <PageLoading />;
  if (rubric.isError) return <ErrorMessage error={rubric.error} what="this rubric" />;
  const detail = rubric.data;
  const v = version.data;

  return (
    <VersionedDocumentPage
      crumbs={[{ label: 'Rubrics', href: paths.rubrics.href() }]}
      title={v?.name ?? selected?.name ?? detail.name}
      subtitle={`For ${(v?.kinds ?? detail.kinds).map((k) => KIND_LABELS[k].toLowerCase()).join(', ')}`}
      versions={versions}
      latest={detail.latest}
      selected={selected}
      onSelect={select}
      canEdit={canEdit}
      editHref={paths.rubricEdit.href(detail.id)}
      publishMessage="A published version never changes: marks and requirement lists can rely on it. Later edits are saved as a new version."
      publishing={publish.isPending}
      onPublish={(versionId) => publish.mutate(versionId)}
      readerActions={
        selected && (
          <Button
            type="button"
            icon="pi pi-download"
            label="Export"
            severity="secondary"
            disabled={exportFile.isPending}
            onClick={() =>
              exportFile.mutate({ id: selected.id, name: selected.name, version: selected.version })
            }
          />
        )
      }
      stateNote={(s) =>
        s.status === 'published' && s.publishedAt
          ? `Published ${formatDateInZone(s.publishedAt, timeZone)}${v?.publishedBy ? ` by ${v.publishedBy.displayName}` : ''}.`
          : `Started ${formatDateInZone(s.createdAt, timeZone)}${v?.createdBy ? ` by ${v.createdBy.displayName}` : ''}; not used for marking until published.`
      }
    >
      {version.isError && <ErrorMessage error={version.error} what="this version" />}
      {v ? (
        <CriteriaView criteria={v.criteria} />
      ) : (
        version.isPending && <PageLoading label="Loading the criteria…" />
      )}
    </VersionedDocumentPage>
  );
}
