import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Analysis } from '../../../../shared/trace/index.ts';
import type { Finding } from '../../../../shared/core/finding.ts';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

/** The report a read-only link opens (`GET /api/shared/reports/:token`, server/features/traces/share-links.ts). */
export type SharedReport = {
  report: {
    trace: { id: number; title: string; fileName: string; format: string; sizeBytes: number; device: string | null; customerRef: string; notes: string; uploadedBy: string; createdAt: string };
    summary: string;
    messages: number;
    counts: Analysis['counts'];
    contracts: Analysis['contracts'];
    findings: (Finding & { title: string })[];
    findingsOmitted: number;
  };
  timeline: Pick<Analysis['timeline'], 'messages' | 'measurements' | 'events' | 'contracts' | 'omitted' | 'measurementStride'>;
  expiresAt: string;
};

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
