import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { formatFingering, type CurrentFingering } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { notify } from '@/lib/notify';
import { useRecordFingering, useFingerings } from '../api/fingerings';
import { useClass } from '../api/get-class';
import { blankFingering, FingeringForm, type FingeringFields } from '../components/FingeringForm';
import { fingeringTitle } from '../components/fingering-labels';
import { FingeringsTable } from '../components/FingeringsTable';
import '../classes.css';
import '../fingerings.css';

function fieldsOf(f: CurrentFingering): FingeringFields {
  return {
    kind: f.kind as FingeringFields['kind'],
    key: f.key,
    mode: f.mode,
    hand: f.hand,
    inversion: f.inversion,
    octaves: f.octaves,
    direction: f.direction,
    digitsText: formatFingering(f.digits),
    note: f.note ?? '',
  };
}

/**
 * A student's approved fingerings (design.md §5, Classes): the current one per request with its
 * history. The student's teachers and admins record them; this, not a default, is what the
 * marking desk shows.
 */
export function StudentFingeringsPage() {
  const { classId = '', studentId = '' } = useParams();
  const me = useCurrentUser();
  const timeZone = activeMembership(me)?.timeZone ?? 'UTC';
  const canEdit = activeRoles(me).some((r) => r === 'admin' || r === 'teacher');
  const cls = useClass(classId);
  const fingerings = useFingerings(studentId);
  const record = useRecordFingering();
  // null: no form; otherwise the fingering being replaced, or 'new'.
  const [editing, setEditing] = useState<CurrentFingering | 'new' | null>(null);

  if (cls.isPending) return <PageLoading />;
  if (cls.isError) return <ErrorMessage error={cls.error} what="this class" />;
  const student = cls.data.members.find((m) => m.id === studentId);
  if (!student)
    return (
      <Alert severity="error">
        This student is not in {cls.data.name}.{' '}
        <Link to={paths.classDetail.href(classId)}>Back to the class</Link>
      </Alert>
    );
  const name = `${student.givenName} ${student.familyName}`;
  const replacing = editing && editing !== 'new' ? editing : null;

  return (
    <section aria-labelledby="fingerings-title">
      <p className="sm-breadcrumb">
        <Link to={paths.classes.href()}>Classes</Link> /{' '}
        <Link to={paths.classDetail.href(classId)}>{cls.data.name}</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="fingerings-title">Approved fingerings: {name}</h1>
          <p className="sm-page-subtitle">
            Pupil number {student.pupilNumber}
            {student.grade !== null ? ` · grade ${student.grade}` : ''}. The marking desk shows the
            current fingering of each request; earlier ones stay as history.
          </p>
        </div>
        {canEdit && editing === null && (
          <Button
            type="button"
            icon="pi pi-plus"
            label="Record a fingering"
            onClick={() => setEditing('new')}
          />
        )}
      </div>

      {editing !== null && (
        <FingeringForm
          key={replacing?.id ?? 'new'}
          title={
            replacing
              ? `Replace the fingering: ${fingeringTitle(replacing)}`
              : `Record a fingering for ${name}`
          }
          defaultValues={replacing ? fieldsOf(replacing) : blankFingering()}
          onCancel={() => setEditing(null)}
          onSave={async (body) => {
            const saved = await record.mutateAsync({ studentId, body });
            setEditing(null);
            notify({
              severity: 'success',
              summary:
                replacing && saved.id === replacing.id
                  ? 'Nothing changed: the fingering stays as it was.'
                  : saved.revision > 1
                    ? `Saved as revision ${saved.revision}; the earlier fingering stays in the history.`
                    : 'The fingering was saved.',
            });
          }}
        />
      )}

      {fingerings.isError ? (
        <ErrorMessage error={fingerings.error} what={`the fingerings of ${name}`} />
      ) : (
        <FingeringsTable
          fingerings={fingerings.data ?? []}
          timeZone={timeZone}
          loading={fingerings.isPending}
          {...(canEdit ? { onReplace: (f: CurrentFingering) => setEditing(f) } : {})}
        />
      )}
    </section>
  );
}
