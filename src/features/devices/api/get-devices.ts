import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

/** A device under test as the API lists it; `pdos` are 32-bit PDO words as 8 hex digits. */
export type Device = {
  id: number | string;
  name: string;
  maker: string;
  model: string;
  role: 'source' | 'sink';
  ratingLabel: string;
  pdpW: number;
  pdos: string[];
  notes: string;
};

export type DevicesResponse = { items: Device[] };

export const deviceKeys = createQueryKeys('devices');

export async function getDevices(signal?: AbortSignal): Promise<DevicesResponse> {
  return api.get<DevicesResponse>('/devices', { signal });
}

export function devicesQueryOptions() {
  return queryOptions({
    queryKey: deviceKeys.list(),
    queryFn: ({ signal }) => getDevices(signal),
  });
}

export function useDevices() {
  return useQuery(devicesQueryOptions());
}
