/**
 * The vector page's model: the file as JSON text is the source of truth; the form reads and
 * writes paths in the parsed object and writes the text back with the engine's formatter, so
 * form and editor never disagree and the saved file is the byte-stable one.
 */
import { formatVector } from '../../../../shared/vectors/format.ts';
import { fail, type Result } from '../../../../shared/core/result.ts';

export type VectorObject = Record<string, unknown>;
export type Path = readonly (string | number)[];

export const vectorKinds = ['decode', 'encode', 'caps', 'request', 'negotiation', 'trace', 'property'] as const;
export type VectorKindName = (typeof vectorKinds)[number];

/** A starting point per kind: a valid file the user then changes. Values are placeholders to edit. */
export function templateFor(kind: VectorKindName, base: { id?: string; title?: string; ref?: string; tags?: string[] } = {}): VectorObject {
  const head = { vector: 1, id: base.id ?? `${kind}/new-vector`, title: base.title ?? 'Describe what this vector checks', tags: base.tags ?? [], ref: base.ref ?? 'USB PD R3.2 V1.1, §', kind };
  switch (kind) {
    case 'decode':
      return { ...head, input: { hex: '' }, expect: { message: { header: { messageType: '' } } } };
    case 'encode':
      return { ...head, input: { message: { sop: 'SOP', header: { messageType: 'Accept' }, objects: [] } }, expect: { hex: '' } };
    case 'caps':
      return { ...head, input: { pdos: ['0x0001912c'] }, expect: { findings: { include: [], exclude: ['*error'] } } };
    case 'request':
      return { ...head, input: { pdos: ['0x0001912c'], sink: { kind: 'max-power' } }, expect: { request: { objectPosition: 1 } } };
    case 'negotiation':
      return {
        ...head,
        input: { scenario: { source: { caps: { pdos: ['0x0001912c'] } }, sink: { policy: { kind: 'max-power' } }, durationMs: 2_000, seed: 1 } },
        expect: { contract: { voltageMv: 5_000 }, sequence: ['Source_Capabilities', 'Request', 'Accept', 'PS_RDY'] },
      };
    case 'trace':
      return { ...head, input: { trace: [] }, expect: { findings: { exclude: ['*error'] } } };
    case 'property':
      return {
        ...head,
        input: { code: 'export default ({ fc, engine }) =>\n  fc.property(engine.arbitraries.lawfulCaps(), (pdos) => {\n    return pdos.length > 0;\n  });\n', runs: 100, seed: 1 },
        expect: { holds: true },
      };
  }
}

export type Parsed = Result<{ value: VectorObject }>;

export function parseText(text: string): Parsed {
  try {
    const value = JSON.parse(text) as unknown;
    if (typeof value !== 'object' || value === null || Array.isArray(value)) return fail('vector.json', 'A vector file is one JSON object { … }.');
    return { ok: true, value: value as VectorObject };
  } catch (error) {
    return fail('vector.json', `The JSON does not parse: ${error instanceof Error ? error.message : String(error)}`);
  }
}

export function toText(value: VectorObject): string {
  return formatVector(value);
}

export function getIn(value: unknown, path: Path): unknown {
  let current = value;
  for (const key of path) {
    if (typeof current !== 'object' || current === null) return undefined;
    current = (current as Record<string | number, unknown>)[key];
  }
  return current;
}

function isEmptyObject(value: unknown): boolean {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && Object.keys(value).length === 0;
}

/**
 * A copy with the value at the path set; `undefined` removes the key, and objects left empty by
 * a removal inside `input` or `expect` go too (an empty `findings: {}` says nothing).
 */
export function setIn(value: VectorObject, path: Path, next: unknown): VectorObject {
  return setAt(value, path, next, 0);
}

function setAt(value: VectorObject, path: Path, next: unknown, depth: number): VectorObject {
  const [key, ...rest] = path;
  if (key === undefined) return value;
  const copy: Record<string | number, unknown> = Array.isArray(value) ? ([...value] as unknown as Record<number, unknown>) : { ...value };
  if (rest.length === 0) {
    if (next === undefined) delete copy[key];
    else copy[key] = next;
    return copy as VectorObject;
  }
  const child = copy[key];
  const base = typeof child === 'object' && child !== null ? (child as VectorObject) : {};
  const updated = setAt(base, rest, next, depth + 1);
  // Top-level objects (input, expect) stay even when empty; deeper ones emptied by a removal go.
  if (next === undefined && isEmptyObject(updated) && depth >= 1) delete copy[key];
  else copy[key] = updated;
  return copy as VectorObject;
}

/** "a, b c" → ["a", "b", "c"]; empty → undefined (the key goes). */
export function listFromText(text: string): string[] | undefined {
  const items = text
    .split(/[\s,]+/)
    .map((s) => s.trim())
    .filter((s) => s !== '');
  return items.length > 0 ? items : undefined;
}

export function textFromList(value: unknown): string {
  return Array.isArray(value) ? value.join(', ') : '';
}

export function numberOrUndefined(text: string): number | undefined {
  if (text.trim() === '') return undefined;
  const n = Number(text);
  return Number.isFinite(n) ? n : undefined;
}
