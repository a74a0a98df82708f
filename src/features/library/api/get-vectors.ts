import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';
import type { VectorFilter, VectorListItem } from '../../../../shared/api/index.ts';

export type VectorsParams = VectorFilter & { sort: string; page: number; pageSize: number };
export type VectorsResponse = { items: VectorListItem[]; total: number; tags: { tag: string; count: number }[] };

export function getVectors(params: VectorsParams, signal?: AbortSignal): Promise<VectorsResponse> {
  return api.get<VectorsResponse>('/vectors', { query: params, signal });
}

export function vectorsQueryOptions(params: VectorsParams) {
  return queryOptions({ queryKey: vectorKeys.list(params), queryFn: ({ signal }) => getVectors(params, signal), placeholderData: keepPreviousData });
}

export function useVectors(params: VectorsParams) {
  return useQuery(vectorsQueryOptions(params));
}

/** The export zip's address for a filter (a plain download link). */
export function exportHref(filter: VectorFilter): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(filter)) if (value !== undefined && value !== '') search.set(key, String(value));
  const text = search.toString();
  return `/api/vectors/export${text ? `?${text}` : ''}`;
}
