import { useId, useState } from 'react';
import { DataTable, type DataTablePageEvent, type DataTableSortEvent } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { Dropdown } from 'primereact/dropdown';
import { Tag } from 'primereact/tag';
import { ConfirmDialog, confirmDialog } from 'primereact/confirmdialog';
import { ROLES, USER_SORT_FIELDS, type Role, type UserRow } from '@stavemark/shared';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { formatDateInZone, roleLabel } from '@/lib/format';
import { notify } from '@/lib/notify';
import { useDebouncedValue } from '@/lib/use-debounced-value';
import { ErrorMessage } from '@/components/ErrorMessage';
import { useUsers, type UsersQuery } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';
import { CreatePersonDialog } from '../components/CreatePersonDialog';
import { EditPersonDialog } from '../components/EditPersonDialog';

type SortField = UsersQuery['sort'];
type StatusFilter = 'all' | 'active' | 'inactive';

const PAGE_SIZES = [20, 50, 100];
const roleOptions: { label: string; value: Role | 'all' }[] = [
  { label: 'All roles', value: 'all' },
  ...ROLES.map((r) => ({ label: roleLabel(r), value: r })),
];
const statusOptions: { label: string; value: StatusFilter }[] = [
  { label: 'Everyone', value: 'all' },
  { label: 'Active', value: 'active' },
  { label: 'Deactivated', value: 'inactive' },
];

function isSortField(field: unknown): field is SortField {
  return typeof field === 'string' && (USER_SORT_FIELDS as readonly string[]).includes(field);
}

export function PeoplePage() {
  const id = useId();
  const me = useCurrentUser();
  const timeZone = activeMembership(me)?.timeZone ?? 'UTC';

  const [search, setSearch] = useState('');
  const [role, setRole] = useState<Role | 'all'>('all');
  const [status, setStatus] = useState<StatusFilter>('all');
  const [page, setPage] = useState(1);
  const [pageSize, setPageSize] = useState(20);
  const [sort, setSort] = useState<SortField>('displayName');
  const [order, setOrder] = useState<'asc' | 'desc'>('asc');
  const [creating, setCreating] = useState(false);
  const [editing, setEditing] = useState<UserRow | null>(null);

  const debouncedSearch = useDebouncedValue(search.trim(), 300);
  const query: UsersQuery = {
    ...(debouncedSearch ? { search: debouncedSearch } : {}),
    ...(role !== 'all' ? { role } : {}),
    ...(status !== 'all' ? { active: status === 'active' } : {}),
    page,
    pageSize,
    sort,
    order,
  };
  const users = useUsers(query);
  const setActive = useUpdateUser();

  // A new filter starts again from the first page.
  const [lastFilter, setLastFilter] = useState(`${debouncedSearch}|${role}|${status}`);
  const filterKey = `${debouncedSearch}|${role}|${status}`;
  if (filterKey !== lastFilter) {
    setLastFilter(filterKey);
    setPage(1);
  }

  const onPage = (e: DataTablePageEvent) => {
    setPageSize(e.rows);
    setPage(Math.floor(e.first / e.rows) + 1);
  };
  const onSort = (e: DataTableSortEvent) => {
    if (!isSortField(e.sortField)) return;
    setSort(e.sortField);
    setOrder(e.sortOrder === -1 ? 'desc' : 'asc');
    setPage(1);
  };

  const changeActive = (person: UserRow, active: boolean) =>
    setActive.mutate(
      { id: person.id, changes: { active } },
      {
        onSuccess: () =>
          notify({
            severity: 'success',
            summary: active
              ? `${person.displayName} can sign in again.`
              : `${person.displayName} is deactivated.`,
          }),
      },
    );

  const askDeactivate = (person: UserRow) =>
    confirmDialog({
      header: `Deactivate ${person.displayName}?`,
      message:
        'They are signed out at once and cannot sign in until reactivated. Their records stay.',
      acceptLabel: 'Deactivate',
      rejectLabel: 'Keep active',
      rejectClassName: 'p-button-secondary',
      defaultFocus: 'reject',
      accept: () => changeActive(person, false),
    });

  const rolesBody = (row: UserRow) => (
    <span className="sm-tags">
      {row.roles.map((r) => (
        <Tag key={r} value={roleLabel(r)} />
      ))}
    </span>
  );
  const statusBody = (row: UserRow) =>
    row.active ? (
      <Tag severity="success" value="Active" />
    ) : (
      <Tag severity="warning" value="Deactivated" />
    );
  const actionsBody = (row: UserRow) => {
    const self = row.id === me.id;
    return (
      <span className="sm-row-actions">
        <Button
          type="button"
          size="small"
          severity="secondary"
          label="Edit"
          aria-label={`Edit ${row.displayName}`}
          onClick={() => setEditing(row)}
        />
        {row.active ? (
          <Button
            type="button"
            size="small"
            severity="secondary"
            label="Deactivate"
            aria-label={`Deactivate ${row.displayName}`}
            disabled={self || setActive.isPending}
            tooltip={self ? 'You cannot deactivate your own sign-in.' : undefined}
            tooltipOptions={{ showOnDisabled: true }}
            onClick={() => askDeactivate(row)}
          />
        ) : (
          <Button
            type="button"
            size="small"
            severity="secondary"
            label="Reactivate"
            aria-label={`Reactivate ${row.displayName}`}
            disabled={setActive.isPending}
            onClick={() => changeActive(row, true)}
          />
        )}
      </span>
    );
  };

  const data = users.data;
  return (
    <section aria-labelledby="people-title">
      <div className="sm-page-header">
        <div>
          <h1 id="people-title">People</h1>
          <p className="sm-page-subtitle">
            Everyone with a sign-in at {activeMembership(me)?.organisationName}, and their roles.
          </p>
        </div>
        <Button
          type="button"
          label="Add a person"
          icon="pi pi-plus"
          onClick={() => setCreating(true)}
        />
      </div>

      <div className="sm-toolbar" role="search">
        <div className="sm-field sm-field-grow">
          <label htmlFor={`${id}-search`}>Search</label>
          <InputText
            id={`${id}-search`}
            type="search"
            placeholder="Name or e-mail"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-role`}>Role</label>
          <Dropdown
            inputId={`${id}-role`}
            value={role}
            options={roleOptions}
            onChange={(e) => setRole(e.value as Role | 'all')}
          />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-status`}>Status</label>
          <Dropdown
            inputId={`${id}-status`}
            value={status}
            options={statusOptions}
            onChange={(e) => setStatus(e.value as StatusFilter)}
          />
        </div>
      </div>

      {users.isError && <ErrorMessage error={users.error} what="the people list" />}

      <div className="sm-table-wrap">
        <DataTable
          value={data?.items ?? []}
          dataKey="id"
          lazy
          paginator
          first={(page - 1) * pageSize}
          rows={pageSize}
          totalRecords={data?.total ?? 0}
          rowsPerPageOptions={PAGE_SIZES}
          onPage={onPage}
          sortField={sort}
          sortOrder={order === 'asc' ? 1 : -1}
          onSort={onSort}
          loading={users.isFetching}
          size="small"
          aria-label="People"
          emptyMessage={users.isPending ? 'Loading…' : 'Nobody matches these filters.'}
          paginatorTemplate="RowsPerPageDropdown FirstPageLink PrevPageLink CurrentPageReport NextPageLink LastPageLink"
          currentPageReportTemplate="{first}–{last} of {totalRecords}"
        >
          <Column field="displayName" header="Name" sortable />
          <Column field="email" header="E-mail" sortable />
          <Column header="Roles" body={rolesBody} />
          <Column header="Status" body={statusBody} />
          <Column
            field="createdAt"
            header="Added"
            sortable
            body={(row: UserRow) => formatDateInZone(row.createdAt, timeZone)}
          />
          <Column
            header={<span className="sm-visually-hidden">Actions</span>}
            body={actionsBody}
            style={{ width: '13rem' }}
          />
        </DataTable>
      </div>

      <CreatePersonDialog
        visible={creating}
        onHide={() => setCreating(false)}
        onCreated={(row) =>
          notify({ severity: 'success', summary: `${row.displayName} was added.` })
        }
      />
      <EditPersonDialog person={editing} onHide={() => setEditing(null)} />
      <ConfirmDialog />
    </section>
  );
}
