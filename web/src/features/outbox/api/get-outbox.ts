import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxList } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

export const outboxKey = ['outbox'] as const;

export function getOutbox(signal?: AbortSignal): Promise<OutboxList> {
  return apiRequest<OutboxList>('/dev/outbox', { signal });
}

export function useOutbox() {
  // Mail goes out a moment after the change that causes it: look again every few seconds.
  return useQuery(
    queryOptions({
      queryKey: outboxKey,
      queryFn: ({ signal }) => getOutbox(signal),
      refetchInterval: 5000,
    }),
  );
}
