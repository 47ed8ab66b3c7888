import { useId } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import type { RequirementListSummary } from '@stavemark/shared';
import { paths } from '@/config/paths';
import '../requirement-lists.css';
import { activeRoles, useCurrentUser } from '@/lib/auth';
import { ErrorMessage } from '@/components/ErrorMessage';
import { useRequirementLists } from '../api/get-requirement-lists';

function versionTag(v: { version: number; status: 'draft' | 'published' }) {
  return (
    <Tag
      severity={v.status === 'published' ? 'success' : 'warning'}
      value={`Version ${v.version} · ${v.status === 'published' ? 'published' : 'draft'}`}
    />
  );
}

export function RequirementListsPage() {
  const id = useId();
  const me = useCurrentUser();
  const navigate = useNavigate();
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  const lists = useRequirementLists();

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
          <Button
            type="button"
            icon="pi pi-plus"
            label="New requirement list"
            onClick={() => navigate(paths.requirementListNew.href())}
          />
        )}
      </div>
      {lists.isError && <ErrorMessage error={lists.error} what="the requirement lists" />}
      <div className="sm-table-wrap">
        <DataTable
          value={lists.data ?? []}
          dataKey="id"
          size="small"
          loading={lists.isFetching}
          pt={{ table: { 'aria-label': 'Requirement lists' } }}
          emptyMessage={lists.isPending ? 'Loading…' : 'No requirement lists yet.'}
        >
          <Column field="grade" header="Grade" />
          <Column
            header="Name"
            body={(l: RequirementListSummary) => (
              <span className="sm-cell-stack">
                <Link to={paths.requirementList.href(l.id)}>{l.name}</Link>
                {l.starterKey && <small className="sm-muted">From the starter library</small>}
              </span>
            )}
          />
          <Column header="Latest" body={(l: RequirementListSummary) => versionTag(l.latest)} />
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
