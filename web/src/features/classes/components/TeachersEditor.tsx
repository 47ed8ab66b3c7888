import { useId, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { MultiSelect } from 'primereact/multiselect';
import { Button } from 'primereact/button';
import type { ClassRow, Page, UserRow } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { notify } from '@/lib/notify';
import { useUpdateClass } from '../api/update-class';

/** Admins choose who teaches a class (one or more teachers of the organisation). */
export function TeachersEditor({ cls }: { cls: ClassRow }) {
  const id = useId();
  const teachers = useQuery({
    queryKey: ['users', 'list', { role: 'teacher', active: true, pageSize: 100 }],
    queryFn: ({ signal }) =>
      apiRequest<Page<UserRow>>('/users', {
        signal,
        query: { role: 'teacher', active: 'true', pageSize: 100 },
      }),
  });
  const [chosen, setChosen] = useState<string[]>(cls.teachers.map((t) => t.id));
  const update = useUpdateClass();
  const changed =
    [...chosen].sort().join() !==
    cls.teachers
      .map((t) => t.id)
      .sort()
      .join();
  return (
    <div className="sm-toolbar">
      <div className="sm-field sm-field-grow">
        <label htmlFor={`${id}-teachers`}>Teachers of this class</label>
        <MultiSelect
          inputId={`${id}-teachers`}
          value={chosen}
          options={(teachers.data?.items ?? []).map((u) => ({ label: u.displayName, value: u.id }))}
          onChange={(e) => setChosen(e.value as string[])}
          placeholder={teachers.isPending ? 'Loading…' : 'Choose teachers'}
          display="chip"
        />
      </div>
      <Button
        type="button"
        label="Save teachers"
        disabled={!changed || chosen.length === 0 || update.isPending}
        onClick={() =>
          update.mutate(
            { id: cls.id, changes: { teacherIds: chosen } },
            {
              onSuccess: () =>
                notify({ severity: 'success', summary: `The teachers of ${cls.name} are saved.` }),
            },
          )
        }
      />
    </div>
  );
}
