import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import { ConfirmDialog, confirmDialog } from 'primereact/confirmdialog';
import type { GuardianView, StudentRow } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { notify } from '@/lib/notify';
import { useRemoveClassMember } from '../api/class-members';
import { useClass } from '../api/get-class';
import { useClasses } from '../api/get-classes';
import { useUpdateStudent } from '../api/students';
import { downloadFile } from '../api/transfer';
import { useUpdateClass } from '../api/update-class';
import { AddStudentDialog } from '../components/AddStudentDialog';
import { TeachersEditor } from '../components/TeachersEditor';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import '../classes.css';

const consentText = (v: boolean | null, what: string) =>
  v === null ? `${what}: not answered` : `${what}: ${v ? 'yes' : 'no'}`;

export function ClassDetailPage() {
  const { classId = '' } = useParams();
  const navigate = useNavigate();
  const detail = useClass(classId);
  const classes = useClasses();
  const updateClass = useUpdateClass();
  const remove = useRemoveClassMember();
  const updateStudent = useUpdateStudent();
  const [adding, setAdding] = useState(false);
  const me = useCurrentUser();
  const isAdmin = activeMembership(me)?.roles.includes('admin') ?? false;

  if (detail.isPending) return <PageLoading />;
  if (detail.isError) return <ErrorMessage error={detail.error} what="this class" />;
  const c = detail.data;

  const guardiansBody = (s: StudentRow) =>
    s.guardians.length ? (
      s.guardians.map((g: GuardianView) => (
        <span key={g.email} className="sm-guardian">
          {g.name}
          <br />
          <small>{g.email}</small>
          <br />
          <small>
            {consentText(g.consentResultsEmail, 'Results by e-mail')} ·{' '}
            {consentText(g.consentRecordings, 'Recordings')}
          </small>
        </span>
      ))
    ) : (
      <span className="sm-muted">None</span>
    );
  const nameBody = (s: StudentRow) => (
    <>
      {/* The student's year of progress (issue 8). */}
      <Link to={paths.studentProgress.href(s.id)}>
        {s.givenName} {s.familyName}
      </Link>{' '}
      {!s.active && <Tag severity="warning" value="Deactivated" />}
      {s.email && (
        <>
          <br />
          <small className="sm-muted">{s.email}</small>
        </>
      )}
    </>
  );
  const actionsBody = (s: StudentRow) => {
    const name = `${s.givenName} ${s.familyName}`;
    return (
      <span className="sm-row-actions">
        <Button
          type="button"
          size="small"
          severity="secondary"
          icon="pi pi-list"
          label="Fingerings"
          aria-label={`Fingerings of ${name}`}
          onClick={() => navigate(paths.studentFingerings.href(c.id, s.id))}
        />
        <Button
          type="button"
          size="small"
          severity="secondary"
          label="Take out"
          aria-label={`Take ${name} out of ${c.name}`}
          onClick={() =>
            confirmDialog({
              header: `Take ${name} out of ${c.name}?`,
              message:
                'They stay a student of the school, with all their records; only their place in this class ends.',
              acceptLabel: 'Take out',
              rejectLabel: 'Keep',
              defaultFocus: 'reject',
              accept: () =>
                remove.mutate(
                  { classId: c.id, studentId: s.id },
                  {
                    onSuccess: () =>
                      notify({ severity: 'success', summary: `${name} left ${c.name}.` }),
                  },
                ),
            })
          }
        />
        <Button
          type="button"
          size="small"
          severity={s.active ? 'danger' : 'secondary'}
          label={s.active ? 'Deactivate' : 'Reactivate'}
          aria-label={`${s.active ? 'Deactivate' : 'Reactivate'} ${name}`}
          onClick={() =>
            updateStudent.mutate(
              { id: s.id, changes: { active: !s.active } },
              {
                onSuccess: () =>
                  notify({
                    severity: 'success',
                    summary: s.active
                      ? `${name} is deactivated; their records stay.`
                      : `${name} is active again.`,
                  }),
              },
            )
          }
        />
      </span>
    );
  };

  return (
    <section aria-labelledby="class-title">
      <p>
        <Link to={paths.classes.href()}>← All classes</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="class-title">{c.name}</h1>
          <p className="sm-page-subtitle">
            Class code {c.code} {!c.active && <Tag severity="warning" value="Deactivated" />}
          </p>
        </div>
        <div className="sm-row-actions">
          <Button
            type="button"
            label="Add a student"
            icon="pi pi-user-plus"
            severity="secondary"
            onClick={() => setAdding(true)}
          />
          <Button
            type="button"
            label="Results"
            icon="pi pi-table"
            severity="secondary"
            onClick={() => navigate(paths.classResults.href(c.id))}
          />
          <Button
            type="button"
            label="Export CSV"
            icon="pi pi-download"
            severity="secondary"
            onClick={() =>
              void downloadFile(`/classes/${c.id}/export`, `class-${c.code}.csv`).catch(
                (e: unknown) => notify({ severity: 'error', summary: String(e) }),
              )
            }
          />
          <Button
            type="button"
            label={c.active ? 'Deactivate the class' : 'Reactivate the class'}
            severity={c.active ? 'danger' : 'secondary'}
            onClick={() =>
              updateClass.mutate(
                { id: c.id, changes: { active: !c.active } },
                {
                  onSuccess: () =>
                    notify({
                      severity: 'success',
                      summary: c.active
                        ? `${c.name} is deactivated.`
                        : `${c.name} is active again.`,
                    }),
                },
              )
            }
          />
        </div>
      </div>
      <dl className="sm-class-meta">
        <div>
          <dt>Teachers</dt>
          <dd>
            {c.teachers.length ? c.teachers.map((t) => t.displayName).join(', ') : 'No teacher yet'}
          </dd>
        </div>
        <div>
          <dt>Students</dt>
          <dd>{c.memberCount}</dd>
        </div>
      </dl>
      {isAdmin && <TeachersEditor key={c.teachers.map((t) => t.id).join()} cls={c} />}
      <div className="sm-table-wrap">
        <DataTable
          value={c.members}
          dataKey="id"
          size="small"
          aria-label="Students in the class"
          emptyMessage="No students in this class yet."
        >
          <Column field="pupilNumber" header="Pupil number" />
          <Column header="Name" body={nameBody} />
          <Column field="dateOfBirth" header="Date of birth" style={{ whiteSpace: 'nowrap' }} />
          <Column field="grade" header="Grade" />
          <Column header="Guardians" body={guardiansBody} />
          <Column header="Classes" body={(s: StudentRow) => s.classCodes.join(', ')} />
          <Column
            header="Sign-in"
            body={(s: StudentRow) => (s.hasSignIn ? 'Yes' : <span className="sm-muted">No</span>)}
          />
          <Column
            header={<span className="sm-visually-hidden">Actions</span>}
            body={actionsBody}
            style={{ width: '21rem' }}
          />
        </DataTable>
      </div>
      <AddStudentDialog
        target={c}
        classes={classes.data ?? []}
        visible={adding}
        onHide={() => setAdding(false)}
      />
      <ConfirmDialog />
    </section>
  );
}
