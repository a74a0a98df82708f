/**
 * A link that opens a scenario on the Bench page: the Bench reads `#scenario=` followed by the
 * scenario's JSON, deflated and base64url-encoded (the Bench's shared-scenario format).
 */
import { deflateSync, strToU8 } from 'fflate';

function toBase64Url(bytes: Uint8Array): string {
  let binary = '';
  for (let index = 0; index < bytes.length; index += 0x8000) binary += String.fromCharCode(...bytes.subarray(index, index + 0x8000));
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

export function benchHref(scenario: unknown): string {
  return `/bench#scenario=${toBase64Url(deflateSync(strToU8(JSON.stringify(scenario)), { level: 9 }))}`;
}
