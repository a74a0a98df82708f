import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { MessagesAroundFindings } from '../../../../shared/api/index.ts';

/** `GET /api/traces/:id/messages-around-findings`: the messages the report lists around its first timed findings. */
export async function getMessagesAroundFindings(id: string | number, signal?: AbortSignal): Promise<MessagesAroundFindings> {
  return api.get<MessagesAroundFindings>(`/traces/${encodeURIComponent(String(id))}/messages-around-findings`, { signal });
}

export function messagesAroundFindingsQueryOptions(id: string | number) {
  return queryOptions({ queryKey: [...traceKeys.detail(id), 'messages-around-findings'], queryFn: ({ signal }) => getMessagesAroundFindings(id, signal) });
}

export function useMessagesAroundFindings(id: string | number) {
  return useQuery(messagesAroundFindingsQueryOptions(id));
}
