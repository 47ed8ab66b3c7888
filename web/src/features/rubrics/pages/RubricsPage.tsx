import { useId, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import { Tag } from 'primereact/tag';
import {
  REQUEST_KINDS,
  type RequestKind,
  type RubricSummary,
  type VersionStatus,
} from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../rubrics.css';
import { activeRoles, useCurrentUser } from '@/lib/auth';
import { notify } from '@/lib/notify';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import {
  AddFromStarterLibrary,
  type UseAddStarterEntry,
  type UseStarterEntries,
} from '@/components/AddFromStarterLibrary';
import { DocumentName, StatusFilter, VersionTag } from '@/components/VersionedDocument';
import { useRubrics } from '../api/get-rubrics';
import { useAdoptStarterRubric, useStarterRubrics } from '../api/starter-library';
import { ImportRubricButton } from '../components/ImportRubricButton';
import { KIND_LABELS } from '../components/labels';

const kindOptions = REQUEST_KINDS.map((k) => ({ label: KIND_LABELS[k], value: k }));

const useStarterEntries: UseStarterEntries = (open) => {
  const q = useStarterRubrics(open);
  return {
    entries: q.data?.map((r) => ({
      key: r.key,
      title: r.name,
      details: `For ${r.kinds.map((k) => KIND_LABELS[k].toLowerCase()).join(', ')} · ${r.criteriaCount} criteria`,
      openHref: r.adopted ? paths.rubric.href(r.adopted.id) : null,
    })),
    error: q.error,
  };
};

const useAddStarterRubric: UseAddStarterEntry = () => {
  const adopt = useAdoptStarterRubric();
  return {
    add: (key) =>
      adopt.mutate(key, {
        onSuccess: (v) =>
          notify({ severity: 'success', summary: `“${v.name}” was added to your school.` }),
      }),
    adding: adopt.isPending ? (adopt.variables ?? null) : null,
    error: adopt.error,
    reset: adopt.reset,
  };
};

export function RubricsPage() {
  const id = useId();
  const me = useCurrentUser();
  const navigate = useNavigate();
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  // null: no filter (the dropdown shows its placeholder).
  const [kind, setKind] = useState<RequestKind | null>(null);
  const [status, setStatus] = useState<VersionStatus | null>(null);

  const [importError, setImportError] = useState<{
    message: string;
    details: { path: string; message: string }[];
  } | null>(null);
  const rubrics = useRubrics({
    ...(kind ? { kind } : {}),
    ...(status ? { status } : {}),
  });

  const nameBody = (r: RubricSummary) => (
    <DocumentName name={r.name} href={paths.rubric.href(r.id)} starter={r.starterKey !== null} />
  );
  const kindsBody = (r: RubricSummary) => (
    <span className="sm-tags">
      {r.kinds.map((k) => (
        <Tag key={k} value={KIND_LABELS[k]} className="sm-tag-quiet" />
      ))}
    </span>
  );

  return (
    <section aria-labelledby={`${id}-title`}>
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>Rubrics</h1>
          <p className="sm-page-subtitle">
            What is assessed in each kind of request, how much each criterion counts, and what each
            mark means.
          </p>
        </div>
        {canEdit && (
          <span className="sm-row-actions">
            <ImportRubricButton
              onImported={(v) => {
                setImportError(null);
                notify({ severity: 'success', summary: `“${v.name}” was imported as a draft.` });
                navigate(paths.rubric.href(v.rubricId));
              }}
              onError={(message, details) => setImportError({ message, details })}
            />
            <AddFromStarterLibrary
              intro="Rubrics written for Stavemark. An added rubric is published as version 1 in your school; edit it like any other (an edit makes a new version)."
              useEntries={useStarterEntries}
              useAdd={useAddStarterRubric}
            />
            <Button
              type="button"
              icon="pi pi-plus"
              label="New rubric"
              onClick={() => navigate(paths.rubricNew.href())}
            />
          </span>
        )}
      </div>

      {importError && (
        <Alert severity="error">
          <strong>The file was not imported.</strong> {importError.message}
          {importError.details.length > 1 && (
            <ul className="sm-error-list">
              {importError.details.map((d) => (
                <li key={`${d.path}:${d.message}`}>
                  <code>{d.path}</code>: {d.message}
                </li>
              ))}
            </ul>
          )}
        </Alert>
      )}

      <div className="sm-toolbar" role="search">
        <div className="sm-field">
          <label htmlFor={`${id}-kind`}>Kind of request</label>
          <Dropdown
            inputId={`${id}-kind`}
            value={kind}
            options={kindOptions}
            placeholder="Every kind"
            showClear
            onChange={(e) => setKind((e.value as RequestKind | undefined) ?? null)}
          />
        </div>
        <StatusFilter id={`${id}-status`} value={status} onChange={setStatus} />
      </div>

      {rubrics.isError && <ErrorMessage error={rubrics.error} what="the rubrics" />}
      <div className="sm-table-wrap">
        <DataTable
          value={rubrics.data ?? []}
          dataKey="id"
          size="small"
          loading={rubrics.isFetching}
          pt={{ table: { 'aria-label': 'Rubrics' } }}
          emptyMessage={rubrics.isPending ? 'Loading…' : 'No rubric matches these filters.'}
          sortField="name"
          sortOrder={1}
          removableSort
        >
          <Column field="name" header="Name" body={nameBody} sortable />
          <Column header="Used for" body={kindsBody} />
          <Column
            header="Latest"
            body={(r: RubricSummary) => (
              <VersionTag version={r.latest.version} status={r.latest.status} />
            )}
          />
          <Column
            header="In use"
            body={(r: RubricSummary) =>
              r.published ? (
                `Version ${r.published.version}`
              ) : (
                <span className="sm-muted">Not published yet</span>
              )
            }
          />
          <Column
            header="Criteria"
            className="sm-num"
            headerClassName="sm-num"
            body={(r: RubricSummary) => r.latest.criteriaCount}
          />
        </DataTable>
      </div>
    </section>
  );
}
