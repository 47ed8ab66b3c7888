import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateUserInput, UserRow } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { usersKey } from './get-users';

export function createUser(input: CreateUserInput): Promise<UserRow> {
  return apiRequest<UserRow>('/users', { method: 'POST', body: input });
}

export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    // The dialog shows 4xx answers (e-mail already here, invalid fields) beside the fields.
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersKey }),
  });
}
