import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { Role } from '../../../lib/roles.ts';
import type { AdminUser } from '../../../../shared/api/index.ts';
import { userKeys } from '../../../lib/query-keys.ts';

export type InviteUserInput = { email: string; name: string; role: Role };

/** Creates the account (invite pending) and mails the invitation link. */
export async function inviteUser(input: InviteUserInput): Promise<AdminUser> {
  const { user } = await api.post<{ user: AdminUser }>('/users/invite', input);
  return user;
}

export function useInviteUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteUser,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: userKeys.lists() });
      // The invitation is now in the Outbox, and the audit log has a line for it.
      await queryClient.invalidateQueries({ queryKey: ['outbox'] });
      await queryClient.invalidateQueries({ queryKey: ['audit'] });
    },
  });
}
