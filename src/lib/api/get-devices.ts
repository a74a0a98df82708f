/**
 * `GET /api/devices`: the devices under test. The Devices page lists them, the Bench and the Offers
 * page load a source's offers from them, the Library files vectors under them; one cached copy.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DevicesResponse } from '../../../shared/api/index.ts';
import { api } from '../api-client.ts';
import { deviceKeys } from '../query-keys.ts';

export function getDevices(signal?: AbortSignal): Promise<DevicesResponse> {
  return api.get<DevicesResponse>('/devices', { signal });
}

export function devicesQueryOptions() {
  return queryOptions({ queryKey: deviceKeys.list(), queryFn: ({ signal }) => getDevices(signal), staleTime: 60_000 });
}

export function useDevices() {
  return useQuery(devicesQueryOptions());
}

/** The sources only: their offers can seed a scenario or the Offers form. */
export function useSourceDevices() {
  return useQuery({ ...devicesQueryOptions(), select: (data) => data.items.filter((device) => device.role === 'source') });
}
