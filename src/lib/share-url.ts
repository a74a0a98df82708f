/**
 * Sharing a scenario by URL: its JSON, deflated (fflate) and base64url-encoded, in the hash
 * (`#scenario=…`), so it never reaches a server log and survives copy and paste.
 */
import { deflateSync, inflateSync, strFromU8, strToU8 } from 'fflate';
import { fail, type Result } from '../../shared/core/result.ts';

export const SHARE_PARAM = 'scenario';

function toBase64Url(bytes: Uint8Array): string {
  let binary = '';
  for (let index = 0; index < bytes.length; index += 0x8000) {
    binary += String.fromCharCode(...bytes.subarray(index, index + 0x8000));
  }
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

function fromBase64Url(text: string): Uint8Array {
  const base64 = text.replace(/-/g, '+').replace(/_/g, '/');
  const binary = atob(base64 + '='.repeat((4 - (base64.length % 4)) % 4));
  const bytes = new Uint8Array(binary.length);
  for (let index = 0; index < binary.length; index += 1) bytes[index] = binary.charCodeAt(index);
  return bytes;
}

/** The compressed form of any JSON value. */
export function encodeShared(value: unknown): string {
  return toBase64Url(deflateSync(strToU8(JSON.stringify(value)), { level: 9 }));
}

export type SharedResult = Result<{ value: unknown }>;

export function decodeShared(text: string): SharedResult {
  try {
    return { ok: true, value: JSON.parse(strFromU8(inflateSync(fromBase64Url(text)))) as unknown };
  } catch {
    return fail('share.damaged', 'The shared scenario in this link is damaged or incomplete.');
  }
}

/** `#scenario=…` for a location; the origin and path are the caller's. */
export function shareHash(value: unknown): string {
  return `#${SHARE_PARAM}=${encodeShared(value)}`;
}

/** The shared payload of a location hash, or null when the hash carries none. */
export function sharedFromHash(hash: string): SharedResult | null {
  const params = new URLSearchParams(hash.replace(/^#/, ''));
  const text = params.get(SHARE_PARAM);
  return text ? decodeShared(text) : null;
}

/** The hash flag that asks the Bench to run the shared scenario as soon as it opens. */
export const AUTORUN_PARAM = 'run';

/**
 * A link that opens the scenario on the Bench (the Runs page offers one beside a failing vector);
 * with `run`, the Bench also runs it at once (a Fault sweep cell opens the run it stands for).
 */
export function benchHref(scenario: unknown, options: { run?: boolean } = {}): string {
  return `/bench${shareHash(scenario)}${options.run ? `&${AUTORUN_PARAM}=1` : ''}`;
}

/** Whether a location hash asks for the shared scenario to be run on opening. */
export function autorunFromHash(hash: string): boolean {
  return new URLSearchParams(hash.replace(/^#/, '')).get(AUTORUN_PARAM) === '1';
}
