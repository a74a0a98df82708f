import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SharedReport } from '../../../../shared/api/index.ts';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

export const sharedReportKeys = createQueryKeys('shared-reports');

export function getSharedReport(token: string, signal?: AbortSignal): Promise<SharedReport> {
  return api.get<SharedReport>(`/shared/reports/${encodeURIComponent(token)}`, { signal });
}

export function sharedReportQueryOptions(token: string) {
  return queryOptions({ queryKey: sharedReportKeys.detail(token), queryFn: ({ signal }) => getSharedReport(token, signal), retry: false });
}

export function useSharedReport(token: string) {
  return useQuery(sharedReportQueryOptions(token));
}
