import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { Role } from '../../../lib/roles.ts';
import type { AdminUser } from '../../../../shared/api/index.ts';
import { userKeys } from '../../../lib/query-keys.ts';

export type UpdateUserInput = { id: AdminUser['id']; role?: Role; active?: boolean; name?: string };

export async function updateUser({ id, ...changes }: UpdateUserInput): Promise<AdminUser> {
  const { user } = await api.patch<{ user: AdminUser }>(`/users/${encodeURIComponent(String(id))}`, changes);
  return user;
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: userKeys.lists() });
      await queryClient.invalidateQueries({ queryKey: ['audit'] });
    },
  });
}
