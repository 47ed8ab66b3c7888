import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AuthSession, SwitchOrganisationInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';

export async function switchOrganisation(input: SwitchOrganisationInput): Promise<AuthSession> {
  return apiRequest<AuthSession>('/auth/switch-organisation', { method: 'POST', body: input });
}

export function useSwitchOrganisation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: switchOrganisation,
    onSuccess: (session) => {
      // Every cached answer belonged to the previous organisation.
      queryClient.clear();
      sessionStore.start(session);
    },
  });
}
