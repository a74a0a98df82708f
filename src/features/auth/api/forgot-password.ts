import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';

export type ForgotPasswordInput = { email: string };

/** The server answers 202 whether or not the address has an account. */
export async function forgotPassword(input: ForgotPasswordInput): Promise<void> {
  await api.post<{ ok: true }>('/auth/forgot', input, { allowUnauthorized: true });
}

export function useForgotPassword() {
  return useMutation({ mutationFn: forgotPassword });
}
