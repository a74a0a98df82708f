import { createContext, useContext } from 'react';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, isApiError } from './api-client.ts';
import type { Role } from './roles.ts';

/** The signed-in user as the API returns it. */
export type User = {
  id?: string | number;
  email: string;
  name: string;
  role: Role;
};

export type UserResponse = { user: User };

/** Who is signed in, and to which organisation. */
export type Session = { user: User; organisation: { name: string } | null };

/** The session, or null when signed out: `GET /api/session` answers 200 either way, so the probe before sign-in logs no failed request. */
export async function getMe(signal?: AbortSignal): Promise<Session | null> {
  try {
    const body = await api.get<{ user: User | null; organisation?: { name: string } | null }>('/session', {
      signal,
      allowUnauthorized: true,
    });
    return body.user ? { user: body.user, organisation: body.organisation ?? null } : null;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const meKeys = { all: ['me'] as const };

export function meQueryOptions() {
  return queryOptions({
    queryKey: meKeys.all,
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });
}

export function useMe() {
  return useQuery(meQueryOptions());
}

/**
 * The session inside the signed-in layout, which provides it only while it is non-null, so pages
 * never see a half-ended session while sign-out or a 401 takes them away.
 */
export const SessionContext = createContext<Session | null>(null);

export function useSession(): Session {
  const session = useContext(SessionContext);
  if (!session) throw new Error('useSession needs the signed-in layout');
  return session;
}

export function useUser(): User {
  return useSession().user;
}

export async function signOut(): Promise<void> {
  await api.post<void>('/auth/logout', undefined, { allowUnauthorized: true });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      // Nothing cached for this session may survive it.
      queryClient.clear();
      queryClient.setQueryData(meKeys.all, null);
    },
  });
}
