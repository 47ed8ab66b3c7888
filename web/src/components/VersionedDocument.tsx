// The page of a versioned document (a rubric, a requirement list): its title and actions, the
// version picker with the version's state, and a notice when an older version is shown. The
// draft → publish → new version rules are the same for both, so the page is written once.
import { useId, type ReactNode } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import { Tag } from 'primereact/tag';
import { ConfirmDialog, confirmDialog } from 'primereact/confirmdialog';
import type { VersionStatus } from '@stavemark/shared';
import { Alert } from './Alert';
import './editor-pages.css';

export interface VersionLike {
  id: string;
  version: number;
  status: VersionStatus;
}

export function VersionTag({ version, status }: { version: number; status: VersionStatus }) {
  return (
    <Tag
      severity={status === 'published' ? 'success' : 'warning'}
      value={`Version ${version} · ${status === 'published' ? 'published' : 'draft'}`}
    />
  );
}

/** The version named in `?version=`, or the newest; `versions` newest first. */
export function useSelectedVersion<V extends VersionLike>(versions: readonly V[]) {
  const [search, setSearch] = useSearchParams();
  const wanted = Number(search.get('version'));
  const selected = versions.find((v) => v.version === wanted) ?? versions[0];
  return { selected, select: (version: number) => setSearch({ version: String(version) }) };
}

/** The link back to the list (and further crumbs), above the title. */
export function Breadcrumb({ crumbs }: { crumbs: { label: string; href: string }[] }) {
  return (
    <p className="sm-breadcrumb">
      {crumbs.map((c, i) => (
        <span key={c.href}>
          {i > 0 && ' / '}
          <Link to={c.href}>{c.label}</Link>
        </span>
      ))}
    </p>
  );
}

interface Props<V extends VersionLike> {
  /** The way back: the list page. */
  crumbs: { label: string; href: string }[];
  title: string;
  subtitle: ReactNode;
  versions: readonly V[];
  latest: VersionLike;
  selected: V | undefined;
  onSelect: (version: number) => void;
  canEdit: boolean;
  editHref: string;
  /** Said before publishing: what a published version means for this document. */
  publishMessage: string;
  publishing: boolean;
  onPublish: (versionId: string) => void;
  /** Actions every reader has (export). */
  readerActions?: ReactNode;
  /** After the version's tag: when and by whom it was published or started. */
  stateNote: (v: V) => ReactNode;
  children: ReactNode;
}

export function VersionedDocumentPage<V extends VersionLike>(p: Props<V>) {
  const id = useId();
  const navigate = useNavigate();
  const { selected, versions } = p;
  const draft = versions.find((v) => v.status === 'draft');

  const askPublish = () =>
    confirmDialog({
      header: `Publish version ${selected?.version}?`,
      message: p.publishMessage,
      acceptLabel: 'Publish',
      rejectLabel: 'Not yet',
      rejectClassName: 'p-button-secondary',
      defaultFocus: 'reject',
      accept: () => selected && p.onPublish(selected.id),
    });

  return (
    <section aria-labelledby={`${id}-title`}>
      <Breadcrumb crumbs={p.crumbs} />
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>{p.title}</h1>
          <p className="sm-page-subtitle">{p.subtitle}</p>
        </div>
        <span className="sm-row-actions">
          {p.readerActions}
          {p.canEdit && selected?.status === 'draft' && (
            <>
              <Button
                type="button"
                icon="pi pi-pencil"
                label="Edit draft"
                severity="secondary"
                onClick={() => navigate(p.editHref)}
              />
              <Button
                type="button"
                icon="pi pi-check"
                label="Publish"
                disabled={p.publishing}
                onClick={askPublish}
              />
            </>
          )}
          {p.canEdit && selected?.status === 'published' && !draft && (
            <Button
              type="button"
              icon="pi pi-pencil"
              label="Edit as a new version"
              onClick={() => navigate(p.editHref)}
            />
          )}
          {p.canEdit && selected?.status === 'published' && draft && (
            <Button
              type="button"
              label={`Open the draft (version ${draft.version})`}
              severity="secondary"
              onClick={() => p.onSelect(draft.version)}
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
            onChange={(e) => p.onSelect(Number(e.value))}
          />
        </div>
        {selected && (
          <p className="sm-muted sm-toolbar-note">
            <VersionTag version={selected.version} status={selected.status} />{' '}
            {p.stateNote(selected)}
          </p>
        )}
      </div>
      {selected && selected.version !== p.latest.version && (
        <Alert severity="info">
          You are looking at version {selected.version}. The latest is version {p.latest.version} (
          {p.latest.status === 'published' ? 'published' : 'a draft'}).
        </Alert>
      )}
      {p.children}
      <ConfirmDialog />
    </section>
  );
}

interface EditorProps {
  crumbs: { label: string; href: string }[];
  /** The version being edited; absent for a new document. */
  editing?: { version: number; status: VersionStatus; name: string };
  /** Title and subtitle of a new document's page (when nothing is being edited). */
  newPage?: { title: string; subtitle: string };
  /** How a published version's next one gets used, e.g. "when sittings may use it". */
  readyWhen: string;
  notices?: ReactNode;
  children: ReactNode;
}

/**
 * The editor page: a new document, a draft edited in place, or the next version of a published
 * one (which stays as it is).
 */
export function VersionEditorPage({
  crumbs,
  editing,
  newPage,
  readyWhen,
  notices,
  children,
}: EditorProps) {
  const id = useId();
  const isDraft = editing?.status === 'draft';
  return (
    <section aria-labelledby={`${id}-title`}>
      <Breadcrumb crumbs={crumbs} />
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>
            {!editing
              ? newPage?.title
              : isDraft
                ? `Edit draft version ${editing.version}`
                : `New version of “${editing.name}”`}
          </h1>
          {!editing && newPage && <p className="sm-page-subtitle">{newPage.subtitle}</p>}
        </div>
      </div>
      {editing && !isDraft && (
        <Alert severity="info">
          Version {editing.version} is published and stays exactly as it is. Saving makes version{' '}
          {editing.version + 1}, a draft, which you publish {readyWhen}.
        </Alert>
      )}
      {notices}
      {children}
    </section>
  );
}

/** The save button's words for an editor page. */
export function saveLabel(editing?: { version: number; status: VersionStatus }): string {
  return !editing || editing.status === 'draft'
    ? 'Save draft'
    : `Save as version ${editing.version + 1}`;
}

/** A document's name in a list, linked, with its starter-library tag beside it. */
export function DocumentName({
  name,
  href,
  starter,
}: {
  name: string;
  href: string;
  starter: boolean;
}) {
  return (
    <span className="sm-name-with-tag">
      <Link to={href}>{name}</Link>
      {starter && (
        <>
          {' '}
          <Tag value="From the starter library" className="sm-tag-quiet" />
        </>
      )}
    </span>
  );
}

export const STATUS_FILTER_OPTIONS: { label: string; value: VersionStatus }[] = [
  { label: 'Has a published version', value: 'published' },
  { label: 'Latest is a draft', value: 'draft' },
];

/** The "state" filter of a list page: empty (any state) until one is chosen. */
export function StatusFilter({
  id,
  value,
  onChange,
}: {
  id: string;
  value: VersionStatus | null;
  onChange: (v: VersionStatus | null) => void;
}) {
  return (
    <div className="sm-field">
      <label htmlFor={id}>State</label>
      <Dropdown
        inputId={id}
        value={value}
        options={STATUS_FILTER_OPTIONS}
        placeholder="Any state"
        showClear
        onChange={(e) => onChange((e.value as VersionStatus | undefined) ?? null)}
      />
    </div>
  );
}
