import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { ContractPage } from '../../../../shared/api/index.ts';

export type ContractPageParams = { page: number; pageSize: number };

/** `GET /api/traces/:id/contracts?page=&pageSize=`: one page of the contracts over time, each with its index. */
export async function getTraceContracts(id: string | number, params: ContractPageParams, signal?: AbortSignal): Promise<ContractPage> {
  return api.get<ContractPage>(`/traces/${encodeURIComponent(String(id))}/contracts?page=${params.page}&pageSize=${params.pageSize}`, { signal });
}

export function traceContractsQueryOptions(id: string | number, params: ContractPageParams) {
  return queryOptions({ queryKey: [...traceKeys.detail(id), 'contracts', params], queryFn: ({ signal }) => getTraceContracts(id, params, signal), placeholderData: keepPreviousData });
}

export function useTraceContracts(id: string | number, params: ContractPageParams, enabled = true) {
  return useQuery({ ...traceContractsQueryOptions(id, params), enabled });
}
