import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function deleteSitting(id: string): Promise<void> {
  return apiRequest<void>(`/sittings/${encodeURIComponent(id)}`, { method: 'DELETE' });
}

export function useDeleteSitting() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteSitting,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
