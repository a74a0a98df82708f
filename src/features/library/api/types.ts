/** Shapes of the vectors API (server/features/vectors/present.ts). */
export type DeviceRef = { id: number; name: string };
export type PersonRef = { id: number; name: string };

export type VectorMeta = {
  device: DeviceRef | null;
  author: PersonRef;
  updatedBy: PersonRef;
  createdAt: string;
  updatedAt: string;
};

export type LastResult = { runId: number; ok: boolean; message: string | null; at: string };

export type VectorListItem = VectorMeta & {
  id: string;
  title: string;
  kind: string;
  tags: string[];
  ref: string;
  revision: number;
  deviceId: number | null;
  lastResult: LastResult | null;
};

/** The vector file's own keys plus the server's `revision`, `deviceId` and `meta`. */
export type StoredVector = Record<string, unknown> & { id: string; revision: number; deviceId: number | null; meta: VectorMeta };

export type VectorFilter = { q?: string; tag?: string; kind?: string; deviceId?: number };

/** 409 `vector.stale`: what is stored now. */
export type StaleDetails = { revision: number; vector: Record<string, unknown>; text: string; updatedBy: string; updatedAt: string };

export type RevisionSummary = { revision: number; message: string; author: PersonRef; createdAt: string };
export type Revision = RevisionSummary & { text: string; vector: Record<string, unknown> };

export type DiffChange = { value: string; added: boolean; removed: boolean; count: number };
export type VectorDiff = { from: number; to: number; patch: string; changes: DiffChange[] };

/** The split off server fields: what goes into the vector file. */
export function fileOf(stored: Record<string, unknown>): Record<string, unknown> {
  const { revision: _r, deviceId: _d, meta: _m, message: _msg, ...file } = stored;
  void _r;
  void _d;
  void _m;
  void _msg;
  return file;
}

export function vectorPath(id: string): string {
  return `/vectors/${encodeURIComponent(id)}`;
}
