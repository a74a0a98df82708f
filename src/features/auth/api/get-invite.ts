import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { Role } from '../../../lib/roles.ts';

export type Invite = { email: string; name: string; role: Role };

export async function getInvite(token: string, signal?: AbortSignal): Promise<Invite> {
  return api.get<Invite>(`/invites/${encodeURIComponent(token)}`, { signal, allowUnauthorized: true });
}

export const inviteKeys = {
  all: ['invites'] as const,
  detail: (token: string) => ['invites', 'detail', token] as const,
};

export function inviteQueryOptions(token: string) {
  return queryOptions({
    queryKey: inviteKeys.detail(token),
    queryFn: ({ signal }) => getInvite(token, signal),
    staleTime: Infinity,
  });
}

export function useInvite(token: string) {
  return useQuery(inviteQueryOptions(token));
}
