import { useParams } from 'react-router-dom';
import { REQUEST_KINDS } from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../requirement-lists.css';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { formatDateInZone } from '@/lib/format';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useSelectedVersion, VersionedDocumentPage } from '@/components/VersionedDocument';
import { useRequirementList } from '../api/get-requirement-list';
import { useRequirementListVersion } from '../api/get-requirement-list-version';
import { usePublishRequirementListVersion } from '../api/publish-requirement-list-version';
import { KIND_LABELS } from '../components/labels';
import { LinesTable } from '../components/LinesTable';
import { SampleDraws } from '../components/SampleDraws';

export function RequirementListPage() {
  const { listId = '' } = useParams();
  const me = useCurrentUser();
  const timeZone = activeMembership(me)?.timeZone ?? 'UTC';
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  const list = useRequirementList(listId);
  const versions = list.data?.versions ?? [];
  const { selected, select } = useSelectedVersion(versions);
  const version = useRequirementListVersion(selected?.id);
  const publish = usePublishRequirementListVersion();

  if (list.isPending) return <PageLoading />;
  if (list.isError) return <ErrorMessage error={list.error} what="this requirement list" />;
  const detail = list.data;
  const v = version.data;
  const minimums = v
    ? REQUEST_KINDS.filter((k) => (v.selectionRule.minPerKind[k] ?? 0) > 0).map(
        (k) => `${v.selectionRule.minPerKind[k]} ${KIND_LABELS[k].toLowerCase()}`,
      )
    : [];

  return (
    <VersionedDocumentPage
      crumbs={[{ label: 'Requirement lists', href: paths.requirementLists.href() }]}
      title={v?.name ?? selected?.name ?? detail.name}
      subtitle={`Grade ${v?.grade ?? detail.grade}`}
      versions={versions}
      latest={detail.latest}
      selected={selected}
      onSelect={select}
      canEdit={canEdit}
      editHref={paths.requirementListEdit.href(detail.id)}
      publishMessage="Sittings can use a published version, and it never changes again. Later edits are saved as a new version."
      publishing={publish.isPending}
      onPublish={(versionId) => publish.mutate(versionId)}
      stateNote={(s) => (
        <>
          {s.status === 'published' && s.publishedAt
            ? `Published ${formatDateInZone(s.publishedAt, timeZone)}.`
            : `Started ${formatDateInZone(s.createdAt, timeZone)}; sittings cannot use it until it is published.`}
          {s.usedAt && ' Used by a sitting: fixed for good.'}
        </>
      )}
    >
      {version.isError && <ErrorMessage error={version.error} what="this version" />}
      {!v && version.isPending && <PageLoading label="Loading the lines…" />}
      {v && (
        <>
          <dl className="sm-figures sm-sheet">
            <div>
              <dt>Total marks</dt>
              <dd>{v.totalMarks}</dd>
            </div>
            <div>
              <dt>Requests asked</dt>
              <dd>{v.selectionRule.count}</dd>
            </div>
            <div>
              <dt>At least</dt>
              <dd className="sm-figure-text">
                {minimums.length ? minimums.join(', ') : 'no minimum'}
              </dd>
            </div>
            <div>
              <dt>Lines</dt>
              <dd>{v.lines.length}</dd>
            </div>
          </dl>
          <LinesTable lines={v.lines} convention={me.noteNames} />
          <SampleDraws
            key={v.id}
            lines={v.lines}
            rule={v.selectionRule}
            convention={me.noteNames}
            initialSeed={`${v.grade}-${v.version}`}
          />
        </>
      )}
    </VersionedDocumentPage>
  );
}
