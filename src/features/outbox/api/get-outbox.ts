import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { outboxKeys } from '../../../lib/query-keys.ts';

export type OutboxItem = { id: number | string; to: string; subject: string; sentAt: string };
export type OutboxResponse = { items: OutboxItem[]; total: number };
export type OutboxParams = { page: number; pageSize: number };

/** Stored mails, newest first; `page` counts from 1. */
export async function getOutbox(params: OutboxParams, signal?: AbortSignal): Promise<OutboxResponse> {
  return api.get<OutboxResponse>('/outbox', { query: params, signal });
}

export function outboxQueryOptions(params: OutboxParams) {
  return queryOptions({
    queryKey: outboxKeys.list(params),
    queryFn: ({ signal }) => getOutbox(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useOutbox(params: OutboxParams) {
  return useQuery(outboxQueryOptions(params));
}
