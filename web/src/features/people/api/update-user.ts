import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateUserInput, UserRow } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { usersKey } from './get-users';

export function updateUser({
  id,
  changes,
}: {
  id: string;
  changes: UpdateUserInput;
}): Promise<UserRow> {
  return apiRequest<UserRow>(`/users/${encodeURIComponent(id)}`, {
    method: 'PATCH',
    body: changes,
  });
}

export function useUpdateUser(options: { inlineErrors?: boolean } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    meta: { inlineErrors: options.inlineErrors ?? false },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersKey }),
  });
}
