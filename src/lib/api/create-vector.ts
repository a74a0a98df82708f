/**
 * `POST /api/vectors`: one fetcher for creating a vector in the team Library, used by the Library's
 * editor and by the Bench's "Save to Library" (features do not import each other, so it lives here).
 */
import { api } from '../api-client.ts';
export { vectorKeys } from '../query-keys.ts';

/** A stored vector as the API presents it: the vector file's fields plus its storage details. */
export type CreatedVector = Record<string, unknown> & { id: string; revision: number };

export function createVector(file: Record<string, unknown>, options: { deviceId?: number | null; message: string }): Promise<CreatedVector> {
  return api.post<CreatedVector>('/vectors', { ...file, deviceId: options.deviceId ?? null, message: options.message });
}
