import { useId } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import { Tag } from 'primereact/tag';
import { ConfirmDialog, confirmDialog } from 'primereact/confirmdialog';
import { REQUEST_KINDS } from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../requirement-lists.css';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { formatDateInZone } from '@/lib/format';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useRequirementList } from '../api/get-requirement-list';
import { useRequirementListVersion } from '../api/get-requirement-list-version';
import { usePublishRequirementListVersion } from '../api/publish-requirement-list-version';
import { KIND_LABELS } from '../components/labels';
import { LinesTable } from '../components/LinesTable';
import { SampleDraws } from '../components/SampleDraws';

export function RequirementListPage() {
  const id = useId();
  const { listId = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const navigate = useNavigate();
  const me = useCurrentUser();
  const timeZone = activeMembership(me)?.timeZone ?? 'UTC';
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  const list = useRequirementList(listId);
  const versions = list.data?.versions ?? [];
  const wanted = Number(search.get('version'));
  const selected = versions.find((v) => v.version === wanted) ?? versions[0];
  const version = useRequirementListVersion(selected?.id);
  const publish = usePublishRequirementListVersion();

  if (list.isPending) return <PageLoading />;
  if (list.isError) return <ErrorMessage error={list.error} what="this requirement list" />;
  const detail = list.data;
  const draft = versions.find((v) => v.status === 'draft');
  const v = version.data;
  const minimums = v
    ? REQUEST_KINDS.filter((k) => (v.selectionRule.minPerKind[k] ?? 0) > 0).map(
        (k) => `${v.selectionRule.minPerKind[k]} ${KIND_LABELS[k].toLowerCase()}`,
      )
    : [];

  const askPublish = () =>
    confirmDialog({
      header: `Publish version ${selected?.version}?`,
      message:
        'Sittings can use a published version, and it never changes again. Later edits are saved as a new version.',
      acceptLabel: 'Publish',
      rejectLabel: 'Not yet',
      rejectClassName: 'p-button-secondary',
      defaultFocus: 'reject',
      accept: () => selected && publish.mutate(selected.id),
    });

  return (
    <section aria-labelledby={`${id}-title`}>
      <p className="sm-breadcrumb">
        <Link to={paths.requirementLists.href()}>Requirement lists</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>{v?.name ?? selected?.name ?? detail.name}</h1>
          <p className="sm-page-subtitle">Grade {v?.grade ?? detail.grade}</p>
        </div>
        <span className="sm-row-actions">
          {canEdit && selected?.status === 'draft' && (
            <>
              <Button
                type="button"
                icon="pi pi-pencil"
                label="Edit draft"
                severity="secondary"
                onClick={() => navigate(paths.requirementListEdit.href(detail.id))}
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
              onClick={() => navigate(paths.requirementListEdit.href(detail.id))}
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
            <Tag
              severity={selected.status === 'published' ? 'success' : 'warning'}
              value={selected.status === 'published' ? 'Published' : 'Draft'}
            />{' '}
            {selected.status === 'published' && selected.publishedAt
              ? `Published ${formatDateInZone(selected.publishedAt, timeZone)}.`
              : `Started ${formatDateInZone(selected.createdAt, timeZone)}; sittings cannot use it until it is published.`}
            {selected.usedAt && ' Used by a sitting: fixed for good.'}
          </p>
        )}
      </div>
      {selected && selected.version !== detail.latest.version && (
        <Alert severity="info">
          You are looking at version {selected.version}. The latest is version{' '}
          {detail.latest.version}.
        </Alert>
      )}
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
      <ConfirmDialog />
    </section>
  );
}
