import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { propertyQueueKeys } from '../../../lib/query-keys.ts';
import type { PropertyQueue } from '../../../../shared/api/index.ts';

export function getPropertyQueue(signal?: AbortSignal): Promise<PropertyQueue> {
  return api.get<PropertyQueue>('/properties/queue', { signal });
}

export function propertyQueueQueryOptions() {
  return queryOptions({
    queryKey: propertyQueueKeys.all,
    queryFn: ({ signal }) => getPropertyQueue(signal),
    // The queue moves by itself: faster while something of anyone's is in it.
    refetchInterval: (query) => (query.state.data && query.state.data.running + query.state.data.waiting > 0 ? 2_000 : 10_000),
    retry: false,
  });
}

export function usePropertyQueue() {
  return useQuery(propertyQueueQueryOptions());
}
