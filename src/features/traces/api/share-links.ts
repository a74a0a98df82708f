import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';

/** A read-only report link as the server presents it (server/features/traces/share-links.ts). */
export type ShareLink = {
  id: number;
  traceId: number;
  createdBy: { id: number; name: string };
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
  state: 'active' | 'expired' | 'revoked';
  url: string | null;
};

const base = (traceId: number) => `/traces/${encodeURIComponent(String(traceId))}/share-links`;
const linksKey = (traceId: number) => [...traceKeys.detail(traceId), 'share-links'] as const;

export function shareLinksQueryOptions(traceId: number) {
  return queryOptions({ queryKey: linksKey(traceId), queryFn: ({ signal }) => api.get<{ items: ShareLink[] }>(base(traceId), { signal }) });
}

export function useShareLinks(traceId: number, enabled: boolean) {
  return useQuery({ ...shareLinksQueryOptions(traceId), enabled });
}

export function useCreateShareLink(traceId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (expiresInDays: number) => api.post<ShareLink>(base(traceId), { expiresInDays }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: linksKey(traceId) }),
  });
}

export function useRevokeShareLink(traceId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (linkId: number) => api.delete<void>(`${base(traceId)}/${linkId}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: linksKey(traceId) }),
  });
}
