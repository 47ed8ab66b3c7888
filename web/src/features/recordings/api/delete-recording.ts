import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import { recordingsKey } from './get-slot-recordings';

export function deleteRecording(id: string): Promise<void> {
  return apiRequest<void>(`/recordings/${encodeURIComponent(id)}`, { method: 'DELETE' });
}

export function useDeleteRecording() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteRecording,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: recordingsKey }),
  });
}
