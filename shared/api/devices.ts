/** `GET /api/devices`, `POST /api/devices`, `PATCH /api/devices/:id`. */
export const deviceRoles = ['source', 'sink'] as const;
export type DeviceRole = (typeof deviceRoles)[number];

/** A device under test; `pdos` are its 32-bit PDO words as 8 lower-case hex digits. */
export interface Device {
  id: number;
  name: string;
  maker: string;
  model: string;
  role: DeviceRole;
  ratingLabel: string;
  pdpW: number;
  pdos: string[];
  notes: string;
}

export interface DevicesResponse {
  items: Device[];
}

export interface DeviceResponse {
  device: Device;
}

/** How other shapes name a device. */
export interface DeviceRef {
  id: number;
  name: string;
}
