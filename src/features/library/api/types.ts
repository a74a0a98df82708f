/** Client helpers over the vectors API; the shapes themselves are in shared/api. */
import { storedVectorKeys } from '../../../../shared/api/index.ts';

/** The split off server fields: what goes into the vector file. */
export function fileOf(stored: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(stored).filter(([key]) => !(storedVectorKeys as readonly string[]).includes(key)));
}

export function vectorPath(id: string): string {
  return `/vectors/${encodeURIComponent(id)}`;
}
