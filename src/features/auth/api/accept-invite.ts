import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { User, UserResponse } from '../../../lib/auth.ts';

export type AcceptInviteInput = { token: string; name?: string; password: string };

/** Accepts an invitation: sets name and password; the server signs the new user in. */
export async function acceptInvite({ token, ...body }: AcceptInviteInput): Promise<User> {
  const { user } = await api.post<UserResponse>(`/invites/${encodeURIComponent(token)}/accept`, body, {
    allowUnauthorized: true,
  });
  return user;
}

export function useAcceptInvite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvite,
    // A new session: nothing cached for another one may leak into it; the layout fetches /me afresh.
    onSuccess: () => queryClient.clear(),
  });
}
