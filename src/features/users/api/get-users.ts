import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { UsersResponse } from '../../../../shared/api/index.ts';
import { userKeys } from '../../../lib/query-keys.ts';

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
