import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError, SessionEndedError } from './api-client';
import { notify } from './notify';

declare module '@tanstack/react-query' {
  interface Register {
    // A mutation whose form shows its own errors sets meta.inlineErrors to skip the toast.
    mutationMeta: { inlineErrors?: boolean; successMessage?: string };
  }
}

function describe(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  if (error instanceof TypeError)
    return 'The server could not be reached. Check the connection and try again.';
  return 'Something went wrong. Please try again.';
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        // Pages show their own load errors; toast only the unexpected ones (server faults, network).
        if (error instanceof SessionEndedError) return;
        if (error instanceof ApiError && error.status < 500) return;
        notify({ severity: 'error', summary: 'Could not load', detail: describe(error) });
      },
    }),
    mutationCache: new MutationCache({
      onError: (error, _vars, _ctx, mutation) => {
        if (error instanceof SessionEndedError) return;
        if (mutation.meta?.inlineErrors && error instanceof ApiError && error.status < 500) return;
        notify({ severity: 'error', summary: 'Not saved', detail: describe(error) });
      },
      onSuccess: (_data, _vars, _ctx, mutation) => {
        const message = mutation.meta?.successMessage;
        if (message) notify({ severity: 'success', summary: message });
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // 4xx answers will not change on retry; retry once for network and server faults.
        retry: (count, error) =>
          !(error instanceof SessionEndedError) &&
          !(error instanceof ApiError && error.status < 500) &&
          count < 1,
      },
    },
  });
}
