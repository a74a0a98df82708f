import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { FindingPage } from '../../../../shared/api/index.ts';
import type { Severity } from '../../../../shared/core/finding.ts';

export type FindingPageParams = { page: number; pageSize: number; severity?: Severity };

/** `GET /api/traces/:id/findings?page=&pageSize=&severity=`: one page of findings in list order, each with its index. */
export async function getTraceFindings(id: string | number, params: FindingPageParams, signal?: AbortSignal): Promise<FindingPage> {
  const query = new URLSearchParams({ page: String(params.page), pageSize: String(params.pageSize), ...(params.severity ? { severity: params.severity } : {}) });
  return api.get<FindingPage>(`/traces/${encodeURIComponent(String(id))}/findings?${query}`, { signal });
}

export function traceFindingsQueryOptions(id: string | number, params: FindingPageParams) {
  return queryOptions({ queryKey: [...traceKeys.detail(id), 'findings', params], queryFn: ({ signal }) => getTraceFindings(id, params, signal), placeholderData: keepPreviousData });
}

export function useTraceFindings(id: string | number, params: FindingPageParams, enabled = true) {
  return useQuery({ ...traceFindingsQueryOptions(id, params), enabled });
}
