import { useId, useState } from 'react';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import type { ClassDetail, ClassRow } from '@stavemark/shared';
import { ErrorMessage } from '@/components/ErrorMessage';
import { notify } from '@/lib/notify';
import { useDebouncedValue } from '@/lib/use-debounced-value';
import { useAddClassMember } from '../api/class-members';
import { useStudents } from '../api/students';

/** Find one of your students and add them here, or move them here from one of your other classes. */
export function AddStudentDialog({
  target,
  classes,
  visible,
  onHide,
}: {
  target: ClassDetail;
  classes: ClassRow[];
  visible: boolean;
  onHide: () => void;
}) {
  const id = useId();
  const [search, setSearch] = useState('');
  const q = useDebouncedValue(search.trim(), 250);
  const students = useStudents({ search: q || undefined, notInClassId: target.id }, visible);
  const add = useAddClassMember();
  const codeToClass = new Map(classes.map((c) => [c.code, c]));

  const act = (studentId: string, name: string, from?: ClassRow) =>
    add.mutate(
      { classId: target.id, input: { studentId, ...(from ? { fromClassId: from.id } : {}) } },
      {
        onSuccess: () =>
          notify({
            severity: 'success',
            summary: from
              ? `${name} moved from ${from.name} to ${target.name}.`
              : `${name} joined ${target.name}.`,
          }),
        onError: (e) => notify({ severity: 'error', summary: e.message }),
      },
    );

  return (
    <Dialog
      header={`Add a student to ${target.name}`}
      visible={visible}
      onHide={onHide}
      style={{ width: 'min(40rem, 96vw)' }}
      modal
    >
      <div className="sm-field">
        <label htmlFor={`${id}-search`}>Find a student</label>
        <InputText
          id={`${id}-search`}
          type="search"
          placeholder="Name or pupil number"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
        />
        <small className="sm-field-hint">
          Students in your classes; new students come in through a class-list import.
        </small>
      </div>
      {students.isError && <ErrorMessage error={students.error} what="the students" />}
      <div role="list" aria-label="Students found">
        {(students.data ?? []).map((s) => {
          const name = `${s.givenName} ${s.familyName}`;
          return (
            <div role="listitem" key={s.id} className="sm-student-pick">
              <span>
                <strong>{name}</strong> <span className="sm-muted">{s.pupilNumber}</span>
                <br />
                <small className="sm-muted">
                  {s.classCodes.length
                    ? `In ${s.classCodes.join(', ')}`
                    : 'In none of your classes'}
                </small>
              </span>
              <span className="sm-row-actions">
                <Button
                  type="button"
                  size="small"
                  label="Add"
                  aria-label={`Add ${name}`}
                  disabled={add.isPending}
                  onClick={() => act(s.id, name)}
                />
                {s.classCodes
                  .map((code) => codeToClass.get(code))
                  .filter((c): c is ClassRow => !!c)
                  .map((from) => (
                    <Button
                      key={from.id}
                      type="button"
                      size="small"
                      severity="secondary"
                      label={`Move from ${from.code}`}
                      aria-label={`Move ${name} here from ${from.name}`}
                      disabled={add.isPending}
                      onClick={() => act(s.id, name, from)}
                    />
                  ))}
              </span>
            </div>
          );
        })}
        {students.data && students.data.length === 0 && (
          <p className="sm-muted">No student found who is not already in this class.</p>
        )}
      </div>
    </Dialog>
  );
}
