import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClassRow, UpdateClassInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { classesKey } from './keys';

export function updateClass({
  id,
  changes,
}: {
  id: string;
  changes: UpdateClassInput;
}): Promise<ClassRow> {
  return apiRequest<ClassRow>(`/classes/${encodeURIComponent(id)}`, {
    method: 'PATCH',
    body: changes,
  });
}

export function useUpdateClass() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateClass,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: classesKey }),
  });
}
