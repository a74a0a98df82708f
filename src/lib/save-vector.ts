/**
 * Saving a vector: to the team library (`POST /api/vectors`, docs/api.md) when this
 * server has it, else as a download; and a download on request in any case. The file is always
 * the byte-stable form (`formatVector`), so a saved and a downloaded copy are the same bytes.
 */
import { isApiError } from './api-client.ts';
import { createVector } from './api/create-vector.ts';
import { downloadText } from './download.ts';
import { formatVector } from '../../shared/vectors/format.ts';

export type SaveOutcome = { kind: 'library'; id: string; revision?: number } | { kind: 'downloaded'; fileName: string; reason: string };

/** `property/demo/x/counterexample` → `property-demo-x-counterexample.vector.json`. */
export function vectorFileName(id: string): string {
  const stem = id.replace(/[^a-z0-9._-]+/gi, '-').replace(/^-+|-+$/g, '') || 'vector';
  return `${stem}.vector.json`;
}

export function downloadVector(vector: Record<string, unknown>): string {
  const fileName = vectorFileName(typeof vector.id === 'string' ? vector.id : 'vector');
  downloadText(fileName, formatVector(vector), 'application/json');
  return fileName;
}

/** Posts the vector to the library; a server without the library route gets a download instead. */
export async function saveVector(vector: Record<string, unknown>): Promise<SaveOutcome> {
  try {
    const stored = await createVector({ file: JSON.parse(formatVector(vector)) as Record<string, unknown> });
    return { kind: 'library', id: stored.id, revision: stored.revision };
  } catch (error) {
    // 404 `route.not-found`: this server has no vector library; anything else (409, 400, 403) is the user's to see.
    if (isApiError(error) && error.status === 404) {
      return { kind: 'downloaded', fileName: downloadVector(vector), reason: 'This server has no team vector library yet' };
    }
    throw error;
  }
}
