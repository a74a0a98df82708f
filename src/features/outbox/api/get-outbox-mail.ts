import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { outboxKeys } from '../../../lib/query-keys.ts';

export type OutboxMail = {
  id: number | string;
  to: string;
  from: string;
  subject: string;
  text: string;
  html: string | null;
  sentAt: string;
};

export async function getOutboxMail(id: string, signal?: AbortSignal): Promise<OutboxMail> {
  return api.get<OutboxMail>(`/outbox/${encodeURIComponent(id)}`, { signal });
}

export function outboxMailQueryOptions(id: string) {
  return queryOptions({
    queryKey: outboxKeys.detail(id),
    queryFn: ({ signal }) => getOutboxMail(id, signal),
    // A sent mail never changes.
    staleTime: Infinity,
  });
}

export function useOutboxMail(id: string | null) {
  return useQuery({ ...outboxMailQueryOptions(id ?? ''), enabled: id !== null });
}
