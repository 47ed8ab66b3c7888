import { useMutation } from '@tanstack/react-query';
import type { AuthSession, LoginInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';

export async function login(input: LoginInput): Promise<AuthSession> {
  // A 401 here is a wrong e-mail or password, not an expired token: never try to refresh.
  return apiRequest<AuthSession>('/auth/login', { method: 'POST', body: input, renewOn401: false });
}

export function useLogin() {
  return useMutation({
    mutationFn: login,
    meta: { inlineErrors: true },
    onSuccess: (session) => sessionStore.start(session),
  });
}
