import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SlotRecordingsView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

export const recordingsKey = ['recordings'] as const;
export const slotRecordingsKey = (slotId: string) => [...recordingsKey, 'slot', slotId] as const;

export function getSlotRecordings(slotId: string, signal?: AbortSignal): Promise<SlotRecordingsView> {
  return apiRequest<SlotRecordingsView>(`/slots/${encodeURIComponent(slotId)}/recordings`, { signal });
}

export const slotRecordingsQueryOptions = (slotId: string) =>
  queryOptions({
    queryKey: slotRecordingsKey(slotId),
    queryFn: ({ signal }) => getSlotRecordings(slotId, signal),
    // Each answer carries playback URLs that expire in minutes; the player renews its own.
    refetchOnWindowFocus: false,
    retry: false,
  });

export function useSlotRecordings(slotId: string, enabled = true) {
  return useQuery({ ...slotRecordingsQueryOptions(slotId), enabled });
}
