import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import type { ClassRow } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { notify } from '@/lib/notify';
import { useClasses } from '../api/get-classes';
import { downloadFile } from '../api/transfer';
import { CreateClassDialog } from '../components/CreateClassDialog';
import { ImportDialog } from '../components/ImportDialog';
import '../classes.css';

export function ClassesPage() {
  const me = useCurrentUser();
  const isAdmin = activeMembership(me)?.roles.includes('admin') ?? false;
  const classes = useClasses();
  const navigate = useNavigate();
  const [importing, setImporting] = useState(false);
  const [creating, setCreating] = useState(false);

  const nameBody = (c: ClassRow) => <Link to={paths.classDetail.href(c.id)}>{c.name}</Link>;
  const teachersBody = (c: ClassRow) =>
    c.teachers.length ? (
      c.teachers.map((t) => t.displayName).join(', ')
    ) : (
      <span className="sm-muted">No teacher yet</span>
    );
  const statusBody = (c: ClassRow) =>
    c.active ? (
      <Tag severity="success" value="Active" />
    ) : (
      <Tag severity="warning" value="Deactivated" />
    );
  const actionsBody = (c: ClassRow) => (
    <Button
      type="button"
      size="small"
      severity="secondary"
      icon="pi pi-download"
      label="Export CSV"
      aria-label={`Export ${c.name} as CSV`}
      onClick={() =>
        void downloadFile(`/classes/${c.id}/export`, `class-${c.code}.csv`).catch((e: unknown) =>
          notify({
            severity: 'error',
            summary: 'The class list could not be exported.',
            detail: e instanceof Error ? e.message : undefined,
          }),
        )
      }
    />
  );

  return (
    <section aria-labelledby="classes-title">
      <div className="sm-page-header">
        <div>
          <h1 id="classes-title">Classes</h1>
          <p className="sm-page-subtitle">
            {isAdmin ? 'Every class of the school, with its teachers.' : 'The classes you teach.'}{' '}
            Import a class list to add or update students.
          </p>
        </div>
        <div className="sm-row-actions">
          <Button
            type="button"
            label="New class"
            icon="pi pi-plus"
            severity="secondary"
            onClick={() => setCreating(true)}
          />
          <Button
            type="button"
            label="Import a class list"
            icon="pi pi-upload"
            onClick={() => setImporting(true)}
          />
        </div>
      </div>

      {classes.isError && <ErrorMessage error={classes.error} what="the classes" />}
      <div className="sm-table-wrap">
        <DataTable
          value={classes.data ?? []}
          dataKey="id"
          size="small"
          aria-label="Classes"
          loading={classes.isFetching}
          emptyMessage={
            classes.isPending
              ? 'Loading…'
              : 'No classes yet. Import a class list or create a class.'
          }
        >
          <Column header="Class" body={nameBody} />
          <Column field="code" header="Code" />
          <Column header="Teachers" body={teachersBody} />
          <Column field="memberCount" header="Students" />
          <Column header="Status" body={statusBody} />
          <Column
            header={<span className="sm-visually-hidden">Actions</span>}
            body={actionsBody}
            style={{ width: '10rem' }}
          />
        </DataTable>
      </div>
      <ImportDialog visible={importing} onHide={() => setImporting(false)} />
      <CreateClassDialog
        visible={creating}
        onHide={() => setCreating(false)}
        onCreated={(c) => {
          notify({ severity: 'success', summary: `${c.name} was created.` });
          navigate(paths.classDetail.href(c.id));
        }}
      />
    </section>
  );
}
