import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

/** The demo devices (GET /api/devices) the Offers page can load; same keys as the devices list, so they share the cache. */
export type SourceDevice = {
  id: number | string;
  name: string;
  maker: string;
  model: string;
  role: 'source' | 'sink';
  ratingLabel: string;
  pdpW: number;
  pdos: string[];
};

const deviceKeys = createQueryKeys('devices');

export async function getSourceDevices(signal?: AbortSignal): Promise<{ items: SourceDevice[] }> {
  return api.get<{ items: SourceDevice[] }>('/devices', { signal });
}

export function sourceDevicesQueryOptions() {
  return queryOptions({ queryKey: deviceKeys.list(), queryFn: ({ signal }) => getSourceDevices(signal) });
}

export function useSourceDevices() {
  return useQuery(sourceDevicesQueryOptions());
}
