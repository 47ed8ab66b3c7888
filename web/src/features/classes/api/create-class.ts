import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClassRow, CreateClassInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { classesKey } from './keys';

export function createClass(input: CreateClassInput): Promise<ClassRow> {
  return apiRequest<ClassRow>('/classes', { method: 'POST', body: input });
}

export function useCreateClass() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createClass,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: classesKey }),
  });
}
