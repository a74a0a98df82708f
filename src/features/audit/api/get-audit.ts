import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { auditKeys } from '../../../lib/query-keys.ts';

export type AuditEvent = {
  id: number | string;
  at: string;
  actor: { email: string; name: string } | null;
  action: string;
  target: string | null;
  details: Record<string, unknown> | null;
};

export type AuditResponse = { items: AuditEvent[]; total: number };
/** `action` is one code or a family ending in "." ("vector." = every vector change); `actor` and `target` match any part. */
export type AuditParams = { page: number; pageSize: number; action?: string; actor?: string; target?: string };

/** One page of the audit log, newest first; `page` counts from 1. */
export async function getAudit(params: AuditParams, signal?: AbortSignal): Promise<AuditResponse> {
  return api.get<AuditResponse>('/audit', { query: params, signal });
}

export function auditQueryOptions(params: AuditParams) {
  return queryOptions({
    queryKey: auditKeys.list(params),
    queryFn: ({ signal }) => getAudit(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useAudit(params: AuditParams) {
  return useQuery(auditQueryOptions(params));
}
