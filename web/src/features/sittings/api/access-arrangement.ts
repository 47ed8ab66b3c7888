import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AccessArrangementInput, AccessArrangementView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

const arrangementKey = (studentId: string) => [...sittingsKey, 'arrangement', studentId] as const;

export function getArrangement(
  studentId: string,
  signal?: AbortSignal,
): Promise<AccessArrangementView> {
  return apiRequest<AccessArrangementView>(
    `/students/${encodeURIComponent(studentId)}/access-arrangement`,
    { signal },
  );
}
export const arrangementQueryOptions = (studentId: string) =>
  queryOptions({
    queryKey: arrangementKey(studentId),
    queryFn: ({ signal }) => getArrangement(studentId, signal),
  });
export function useArrangement(studentId: string | null) {
  return useQuery({ ...arrangementQueryOptions(studentId ?? ''), enabled: studentId !== null });
}

export function putArrangement({
  studentId,
  input,
}: {
  studentId: string;
  input: AccessArrangementInput;
}): Promise<AccessArrangementView> {
  return apiRequest<AccessArrangementView>(
    `/students/${encodeURIComponent(studentId)}/access-arrangement`,
    { method: 'PUT', body: input },
  );
}
export function usePutArrangement() {
  const queryClient = useQueryClient();
  // Slot lengths change with the arrangement: every sitting view is refreshed.
  return useMutation({
    mutationFn: putArrangement,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
