import { useId, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import type { RequirementListSummary, VersionStatus } from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../requirement-lists.css';
import { activeRoles, useCurrentUser } from '@/lib/auth';
import { notify } from '@/lib/notify';
import { ErrorMessage } from '@/components/ErrorMessage';
import {
  AddFromStarterLibrary,
  type UseAddStarterEntry,
  type UseStarterEntries,
} from '@/components/AddFromStarterLibrary';
import { DocumentName, StatusFilter, VersionTag } from '@/components/VersionedDocument';
import { useRequirementLists } from '../api/get-requirement-lists';
import { useAdoptStarterList, useStarterLists } from '../api/starter-library';

const useStarterEntries: UseStarterEntries = (open) => {
  const q = useStarterLists(open);
  return {
    entries: q.data?.map((l) => ({
      key: l.key,
      title: l.name,
      details: `Grade ${l.grade} · ${l.lineCount} lines · ${l.totalMarks} marks`,
      openHref: l.adopted ? paths.requirementList.href(l.adopted.id) : null,
    })),
    error: q.error,
  };
};

/** A list may bring starter rubrics with it; the notice names them. */
const useAddStarterList: UseAddStarterEntry = () => {
  const adopt = useAdoptStarterList();
  return {
    add: (key) =>
      adopt.mutate(key, {
        onSuccess: ({ version, rubricsAdded }) =>
          notify({
            severity: 'success',
            summary: `“${version.name}” was added to your school${
              rubricsAdded.length
                ? `, with ${rubricsAdded.map((r) => `“${r.name}”`).join(' and ')}`
                : ''
            }.`,
          }),
      }),
    adding: adopt.isPending ? (adopt.variables ?? null) : null,
    error: adopt.error,
    reset: adopt.reset,
  };
};

export function RequirementListsPage() {
  const id = useId();
  const me = useCurrentUser();
  const navigate = useNavigate();
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  // null: no filter (the dropdowns show their placeholders).
  const [grade, setGrade] = useState<string | null>(null);
  const [status, setStatus] = useState<VersionStatus | null>(null);
  const all = useRequirementLists();
  const lists = useRequirementLists({
    ...(grade ? { grade } : {}),
    ...(status ? { status } : {}),
  });
  const grades = [...new Set((all.data ?? []).map((l) => l.grade))].sort((a, b) =>
    a.localeCompare(b, 'en', { numeric: true }),
  );

  return (
    <section aria-labelledby={`${id}-title`}>
      <div className="sm-page-header">
        <div>
          <h1 id={`${id}-title`}>Requirement lists</h1>
          <p className="sm-page-subtitle">
            What may be asked at each grade, written as templates; the examiner’s requests are drawn
            from them.
          </p>
        </div>
        {canEdit && (
          <span className="sm-row-actions">
            <AddFromStarterLibrary
              intro="Requirement lists written for Stavemark, published as version 1 in your school. The starter rubrics a list is marked with come with it when your school has none of them yet."
              useEntries={useStarterEntries}
              useAdd={useAddStarterList}
            />
            <Button
              type="button"
              icon="pi pi-plus"
              label="New requirement list"
              onClick={() => navigate(paths.requirementListNew.href())}
            />
          </span>
        )}
      </div>
      <div className="sm-toolbar" role="search">
        <div className="sm-field">
          <label htmlFor={`${id}-grade`}>Grade</label>
          <Dropdown
            inputId={`${id}-grade`}
            value={grade}
            options={grades.map((g) => ({ label: `Grade ${g}`, value: g }))}
            placeholder="Every grade"
            showClear
            onChange={(e) => setGrade((e.value as string | undefined) ?? null)}
          />
        </div>
        <StatusFilter id={`${id}-status`} value={status} onChange={setStatus} />
      </div>
      {lists.isError && <ErrorMessage error={lists.error} what="the requirement lists" />}
      <div className="sm-table-wrap">
        <DataTable
          value={lists.data ?? []}
          dataKey="id"
          size="small"
          loading={lists.isFetching}
          pt={{ table: { 'aria-label': 'Requirement lists' } }}
          emptyMessage={
            lists.isPending
              ? 'Loading…'
              : grade || status
                ? 'No requirement list matches these filters.'
                : 'No requirement lists yet.'
          }
        >
          <Column field="grade" header="Grade" />
          <Column
            header="Name"
            body={(l: RequirementListSummary) => (
              <DocumentName
                name={l.name}
                href={paths.requirementList.href(l.id)}
                starter={l.starterKey !== null}
              />
            )}
          />
          <Column
            header="Latest"
            body={(l: RequirementListSummary) => (
              <VersionTag version={l.latest.version} status={l.latest.status} />
            )}
          />
          <Column
            header="In use"
            body={(l: RequirementListSummary) =>
              l.published ? (
                `Version ${l.published.version}`
              ) : (
                <span className="sm-muted">Not published yet</span>
              )
            }
          />
          <Column
            header="Lines"
            className="sm-num"
            headerClassName="sm-num"
            body={(l: RequirementListSummary) => l.latest.lineCount}
          />
          <Column
            header="Total marks"
            className="sm-num"
            headerClassName="sm-num"
            body={(l: RequirementListSummary) => l.latest.totalMarks}
          />
        </DataTable>
      </div>
    </section>
  );
}
