import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DeskView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { markingKey } from './get-marking-today';

export function getDesk(slotId: string, signal?: AbortSignal): Promise<DeskView> {
  return apiRequest<DeskView>(`/slots/${encodeURIComponent(slotId)}/desk`, { signal });
}

export const deskQueryOptions = (slotId: string) =>
  queryOptions({
    queryKey: [...markingKey, 'desk', slotId],
    queryFn: ({ signal }) => getDesk(slotId, signal),
    // The desk's own state is the save queue; refetching mid-slot would only redraw it.
    refetchOnWindowFocus: false,
    staleTime: Infinity,
  });

export function useDesk(slotId: string) {
  return useQuery(deskQueryOptions(slotId));
}
