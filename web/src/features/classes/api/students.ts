import {
  keepPreviousData,
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
} from '@tanstack/react-query';
import type { StudentRow, UpdateStudentInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { classesKey, studentsKey } from './keys';

export function getStudents(
  q: { search?: string; notInClassId?: string },
  signal?: AbortSignal,
): Promise<StudentRow[]> {
  return apiRequest<StudentRow[]>('/students', {
    signal,
    query: { search: q.search || undefined, notInClassId: q.notInClassId },
  });
}

export const studentsQueryOptions = (q: { search?: string; notInClassId?: string }) =>
  queryOptions({
    queryKey: [...studentsKey, q],
    queryFn: ({ signal }) => getStudents(q, signal),
    placeholderData: keepPreviousData,
  });

export function useStudents(q: { search?: string; notInClassId?: string }, enabled = true) {
  return useQuery({ ...studentsQueryOptions(q), enabled });
}

export function updateStudent({
  id,
  changes,
}: {
  id: string;
  changes: UpdateStudentInput;
}): Promise<StudentRow> {
  return apiRequest<StudentRow>(`/students/${encodeURIComponent(id)}`, {
    method: 'PATCH',
    body: changes,
  });
}

export function useUpdateStudent() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateStudent,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: classesKey }),
        queryClient.invalidateQueries({ queryKey: studentsKey }),
      ]),
  });
}
