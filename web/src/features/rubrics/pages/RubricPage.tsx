import { useId } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import { ConfirmDialog, confirmDialog } from 'primereact/confirmdialog';
import { paths } from '@/config/paths';
import '../rubrics.css';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { formatDateInZone } from '@/lib/format';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useRubric } from '../api/get-rubric';
import { useRubricVersion } from '../api/get-rubric-version';
import { usePublishRubricVersion } from '../api/publish-rubric-version';
import { useExportRubricVersion } from '../api/export-rubric-version';
import { CriteriaView } from '../components/CriteriaView';
import { KIND_LABELS } from '../components/labels';
import { VersionTag } from '../components/VersionTag';

export function RubricPage() {
  const id = useId();
  const { rubricId = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const navigate = useNavigate();
  const me = useCurrentUser();
  const timeZone = activeMembership(me)?.timeZone ?? 'UTC';
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  const rubric = useRubric(rubricId);
  const versions = rubric.data?.versions ?? [];
  const wanted = Number(search.get('version'));
  const selected = versions.find((v) => v.version === wanted) ?? versions[0];
  const version = useRubricVersion(selected?.id);
  const publish = usePublishRubricVersion();
  const exportFile = useExportRubricVersion();

  if (rubric.isPending) return <PageLoading />;
  if (rubric.isError) return <ErrorMessage error={rubric.error} what="this rubric" />;
  const detail = rubric.data;
  const latest = detail.latest;
  const draft = versions.find((v) => v.status === 'draft');
  const v = version.data;

  const askPublish = () =>
    confirmDialog({
      header: `Publish version ${selected?.version}?`,
      message:
        'A published version never changes: marks and requirement lists can rely on it. Later edits are saved as a new version.',
      acceptLabel: 'Publish',
      rejectLabel: 'Not yet',
      rejectClassName: 'p-button-secondary',
      defaultFocus: 'reject',
      accept: () => selected && publish.mutate(selected.id),
    });

  return (
    <section aria-labelledby={`${id}-title`}>
      <p className="sm-breadcrumb">
        <Link to={paths.rubrics.href()}>Rubrics</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>{v?.name ?? selected?.name ?? detail.name}</h1>
          <p className="sm-page-subtitle">
            For {(v?.kinds ?? detail.kinds).map((k) => KIND_LABELS[k].toLowerCase()).join(', ')}
          </p>
        </div>
        <span className="sm-row-actions">
          {selected && (
            <Button
              type="button"
              icon="pi pi-download"
              label="Export"
              severity="secondary"
              disabled={exportFile.isPending}
              onClick={() =>
                exportFile.mutate({
                  id: selected.id,
                  name: selected.name,
                  version: selected.version,
                })
              }
            />
          )}
          {canEdit && selected?.status === 'draft' && (
            <>
              <Button
                type="button"
                icon="pi pi-pencil"
                label="Edit draft"
                severity="secondary"
                onClick={() => navigate(paths.rubricEdit.href(detail.id))}
              />
              <Button
                type="button"
                icon="pi pi-check"
                label="Publish"
                disabled={publish.isPending}
                onClick={askPublish}
              />
            </>
          )}
          {canEdit && selected?.status === 'published' && !draft && (
            <Button
              type="button"
              icon="pi pi-pencil"
              label="Edit as a new version"
              onClick={() => navigate(paths.rubricEdit.href(detail.id))}
            />
          )}
          {canEdit && selected?.status === 'published' && draft && (
            <Button
              type="button"
              label={`Open the draft (version ${draft.version})`}
              severity="secondary"
              onClick={() => setSearch({ version: String(draft.version) })}
            />
          )}
        </span>
      </div>

      <div className="sm-toolbar">
        <div className="sm-field">
          <label htmlFor={`${id}-version`}>Version</label>
          <Dropdown
            inputId={`${id}-version`}
            value={selected?.version}
            options={versions.map((x) => ({
              label: `Version ${x.version} · ${x.status === 'published' ? 'published' : 'draft'}`,
              value: x.version,
            }))}
            onChange={(e) => setSearch({ version: String(e.value) })}
          />
        </div>
        {selected && (
          <p className="sm-muted sm-toolbar-note">
            <VersionTag version={selected.version} status={selected.status} />{' '}
            {selected.status === 'published' && selected.publishedAt
              ? `Published ${formatDateInZone(selected.publishedAt, timeZone)}${v?.publishedBy ? ` by ${v.publishedBy.displayName}` : ''}.`
              : `Started ${formatDateInZone(selected.createdAt, timeZone)}${v?.createdBy ? ` by ${v.createdBy.displayName}` : ''}; not used for marking until published.`}
          </p>
        )}
      </div>

      {selected && selected.version !== latest.version && (
        <Alert severity="info">
          You are looking at version {selected.version}. The latest is version {latest.version} (
          {latest.status === 'published' ? 'published' : 'a draft'}).
        </Alert>
      )}
      {version.isError && <ErrorMessage error={version.error} what="this version" />}
      {v ? (
        <CriteriaView criteria={v.criteria} />
      ) : (
        version.isPending && <PageLoading label="Loading the criteria…" />
      )}
      <ConfirmDialog />
    </section>
  );
}
