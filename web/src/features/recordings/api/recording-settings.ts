import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RecordingSettingsInput, RecordingSettingsView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { recordingsKey } from './get-slot-recordings';

const settingsKey = [...recordingsKey, 'settings'] as const;

export const recordingSettingsQueryOptions = () =>
  queryOptions({
    queryKey: settingsKey,
    queryFn: ({ signal }) => apiRequest<RecordingSettingsView>('/recording-settings', { signal }),
  });

export function useRecordingSettings() {
  return useQuery(recordingSettingsQueryOptions());
}

export function useUpdateRecordingSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RecordingSettingsInput) =>
      apiRequest<RecordingSettingsView>('/recording-settings', { method: 'PUT', body: input }),
    meta: { inlineErrors: true },
    onSuccess: (view) => {
      queryClient.setQueryData(settingsKey, view);
      return queryClient.invalidateQueries({ queryKey: recordingsKey });
    },
  });
}
