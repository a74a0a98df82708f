import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

/** A demo device as `GET /api/devices` lists it; `pdos` are 32-bit words as 8 hex digits. */
export type BenchDevice = {
  id: number | string;
  name: string;
  model: string;
  role: 'source' | 'sink';
  ratingLabel: string;
  pdpW: number;
  pdos: string[];
};

// The same key as every other list of devices, so the pages share one cached copy.
export const deviceKeys = createQueryKeys('devices');

export async function getDevices(signal?: AbortSignal): Promise<{ items: BenchDevice[] }> {
  return api.get<{ items: BenchDevice[] }>('/devices', { signal });
}

export function devicesQueryOptions() {
  return queryOptions({ queryKey: deviceKeys.list(), queryFn: ({ signal }) => getDevices(signal), staleTime: 60_000 });
}

/** The sources only: their offers can seed a scenario. */
export function useSourceDevices() {
  return useQuery({ ...devicesQueryOptions(), select: (data) => data.items.filter((device) => device.role === 'source') });
}
