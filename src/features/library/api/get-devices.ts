import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

export type Device = { id: number; name: string; role: 'source' | 'sink' };

const deviceKeys = createQueryKeys('library-devices');

export function getDevices(signal?: AbortSignal): Promise<{ items: Device[] }> {
  return api.get<{ items: Device[] }>('/devices', { signal });
}

export function devicesQueryOptions() {
  return queryOptions({ queryKey: deviceKeys.lists(), queryFn: ({ signal }) => getDevices(signal), staleTime: 60_000 });
}

export function useDevices() {
  return useQuery(devicesQueryOptions());
}
