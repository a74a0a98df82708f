import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';
import type { Role } from '../../../lib/roles.ts';

export type AdminUser = {
  id: number | string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  invitePending: boolean;
  createdAt: string;
  lastSignInAt: string | null;
};

export type UsersResponse = { items: AdminUser[]; total: number };

export const userKeys = createQueryKeys('users');

export async function getUsers(signal?: AbortSignal): Promise<UsersResponse> {
  return api.get<UsersResponse>('/users', { signal });
}

export function usersQueryOptions() {
  return queryOptions({
    queryKey: userKeys.list(),
    queryFn: ({ signal }) => getUsers(signal),
  });
}

export function useUsers() {
  return useQuery(usersQueryOptions());
}
