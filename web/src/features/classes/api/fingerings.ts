import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CurrentFingering, StudentFingeringInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

/** A student's fingerings; a recorded one refreshes the student's list. */
export const fingeringsKey = (studentId: string) => ['fingerings', studentId] as const;

export function getFingerings(
  studentId: string,
  signal?: AbortSignal,
): Promise<CurrentFingering[]> {
  return apiRequest<CurrentFingering[]>(`/students/${encodeURIComponent(studentId)}/fingerings`, {
    signal,
  });
}

export const fingeringsQueryOptions = (studentId: string) =>
  queryOptions({
    queryKey: fingeringsKey(studentId),
    queryFn: ({ signal }) => getFingerings(studentId, signal),
  });

export function useFingerings(studentId: string) {
  return useQuery(fingeringsQueryOptions(studentId));
}

export function recordFingering({
  studentId,
  body,
}: {
  studentId: string;
  body: StudentFingeringInput;
}): Promise<CurrentFingering> {
  return apiRequest<CurrentFingering>(`/students/${encodeURIComponent(studentId)}/fingerings`, {
    method: 'POST',
    body,
  });
}

export function useRecordFingering() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordFingering,
    onSuccess: (_saved, { studentId }) =>
      queryClient.invalidateQueries({ queryKey: fingeringsKey(studentId) }),
  });
}
