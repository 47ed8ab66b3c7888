import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AddClassMemberInput, ClassDetail } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { classesKey, studentsKey } from './keys';

export function addClassMember({
  classId,
  input,
}: {
  classId: string;
  input: AddClassMemberInput;
}): Promise<ClassDetail> {
  return apiRequest<ClassDetail>(`/classes/${encodeURIComponent(classId)}/members`, {
    method: 'POST',
    body: input,
  });
}

export function removeClassMember({
  classId,
  studentId,
}: {
  classId: string;
  studentId: string;
}): Promise<void> {
  return apiRequest<void>(
    `/classes/${encodeURIComponent(classId)}/members/${encodeURIComponent(studentId)}`,
    { method: 'DELETE' },
  );
}

function useInvalidate() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: classesKey }),
      queryClient.invalidateQueries({ queryKey: studentsKey }),
    ]);
}

export function useAddClassMember() {
  const invalidate = useInvalidate();
  return useMutation({ mutationFn: addClassMember, onSuccess: invalidate });
}

export function useRemoveClassMember() {
  const invalidate = useInvalidate();
  return useMutation({ mutationFn: removeClassMember, onSuccess: invalidate });
}
