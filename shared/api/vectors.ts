/** The team's vector library (`/api/vectors…`): list rows, stored vectors, revisions and diffs. */
import type { DeviceRef } from './devices.ts';
import type { PersonRef } from './people.ts';

export interface VectorMeta {
  device: DeviceRef | null;
  author: PersonRef;
  updatedBy: PersonRef;
  createdAt: string;
  updatedAt: string;
}

/** The newest stored result of a vector. */
export interface LastResult {
  runId: number;
  ok: boolean;
  message: string | null;
  at: string;
}

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

export interface VectorsResponse {
  items: VectorListItem[];
  total: number;
  tags: { tag: string; count: number }[];
}

/** Keys the server adds to a vector file; a PUT sends them back and the server strips them. */
export const storedVectorKeys = ['revision', 'message', 'deviceId', 'meta'] as const;

/** The vector file's own keys plus the server's `revision`, `deviceId` and `meta`. */
export type StoredVector = Record<string, unknown> & { id: string; revision: number; deviceId: number | null; meta: VectorMeta };

/** A type, not an interface, so it passes as a query-string record. */
export type VectorFilter = {
  q?: string;
  tag?: string;
  kind?: string;
  deviceId?: number;
};

/** The details of a 409 `vector.stale`: what is stored now. */
export interface StaleDetails {
  revision: number;
  vector: Record<string, unknown>;
  text: string;
  updatedBy: string;
  updatedAt: string;
}

export interface RevisionSummary {
  revision: number;
  message: string;
  author: PersonRef;
  createdAt: string;
}

export type Revision = RevisionSummary & { text: string; vector: Record<string, unknown> };

export interface DiffChange {
  value: string;
  added: boolean;
  removed: boolean;
  count: number;
}

export interface VectorDiff {
  from: number;
  to: number;
  patch: string;
  changes: DiffChange[];
}

export interface ImportResult {
  created: number;
  updated: number;
  unchanged: number;
  total: number;
}
