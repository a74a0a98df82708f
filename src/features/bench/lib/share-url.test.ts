import { describe, expect, it } from 'vitest';
import { unzlibSync } from 'fflate';
import { autorunFromHash, benchHref, decodeShared, encodeShared, shareHash, sharedFromHash } from '../../../lib/share-url.ts';
import { defaultScenario } from './form-model.ts';

describe('share-url', () => {
  it('round-trips a scenario through the hash', () => {
    const hash = shareHash(defaultScenario);
    expect(hash.startsWith('#scenario=')).toBe(true);
    // base64url: no characters that need escaping in a URL
    expect(hash.slice('#scenario='.length)).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(sharedFromHash(hash)).toEqual({ ok: true, value: defaultScenario });
  });

  it('compresses: a scenario is far shorter than its JSON', () => {
    const scenario = { ...defaultScenario, faults: Array.from({ length: 20 }, (_, index) => ({ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: index + 1 })) };
    expect(encodeShared(scenario).length).toBeLessThan(JSON.stringify(scenario).length / 3);
  });

  it('is raw DEFLATE (RFC 1951), not zlib-wrapped', () => {
    const text = encodeShared({ a: 1 });
    const bytes = Uint8Array.from(atob(text.replace(/-/g, '+').replace(/_/g, '/') + '=='.slice(0, (4 - (text.length % 4)) % 4)), (c) => c.charCodeAt(0));
    expect(() => unzlibSync(bytes)).toThrow();
  });

  it('reports a damaged payload instead of throwing', () => {
    expect(decodeShared('not!valid')).toEqual({ ok: false, error: { code: 'share.damaged', message: expect.stringContaining('damaged') } });
    expect(sharedFromHash('#other=1')).toBeNull();
    expect(sharedFromHash('')).toBeNull();
  });
});

describe('benchHref', () => {
  it('gives a /bench link whose hash the Bench decodes to the same scenario', () => {
    const scenario = { source: { caps: { pdos: ['0x0001912c'] } }, sink: { policy: { kind: 'max-power' } }, durationMs: 2_000, seed: 7 };
    const href = benchHref(scenario);
    expect(href.startsWith('/bench#scenario=')).toBe(true);
    expect(sharedFromHash(href.slice('/bench'.length))).toEqual({ ok: true, value: scenario });
  });

  it('asks the Bench to run the scenario at once only when told (a Fault sweep cell)', () => {
    const scenario = { source: { caps: { pdos: ['0x0001912c'] } }, durationMs: 2_000 };
    const plain = benchHref(scenario).slice('/bench'.length);
    const running = benchHref(scenario, { run: true }).slice('/bench'.length);
    expect(autorunFromHash(plain)).toBe(false);
    expect(autorunFromHash(running)).toBe(true);
    expect(running.endsWith('&run=1')).toBe(true);
    // The scenario reads the same with the flag.
    expect(sharedFromHash(running)).toEqual({ ok: true, value: scenario });
  });
});
