import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { User, UserResponse } from '../../../lib/auth.ts';

export type SignInInput = { email: string; password: string };

export async function signIn(input: SignInInput): Promise<User> {
  const { user } = await api.post<UserResponse>('/auth/login', input, { allowUnauthorized: true });
  return user;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    // A new session: nothing cached for another one may leak into it; the layout fetches /me afresh.
    onSuccess: () => queryClient.clear(),
  });
}
