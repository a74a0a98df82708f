import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { User, UserResponse } from '../../../lib/auth.ts';

export type ResetPasswordInput = { token: string; password: string };

/** Sets a new password from a reset link; the server signs the user in. */
export async function resetPassword(input: ResetPasswordInput): Promise<User> {
  const { user } = await api.post<UserResponse>('/auth/reset', input, { allowUnauthorized: true });
  return user;
}

export function useResetPassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resetPassword,
    // A new session: nothing cached for another one may leak into it; the layout fetches /me afresh.
    onSuccess: () => queryClient.clear(),
  });
}
