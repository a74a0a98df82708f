import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { resolveSecret } from './secret.ts';

const tempDir = () => mkdtempSync(join(tmpdir(), 'parley-secret-'));

describe('resolveSecret', () => {
  it('generates a 0600 secret file once and reuses it', () => {
    const dataDir = join(tempDir(), 'nested');
    const first = resolveSecret({ dataDir, production: false });
    expect(first).toMatch(/^[0-9a-f]{64}$/);
    expect(statSync(join(dataDir, 'secret')).mode & 0o777).toBe(0o600);
    expect(resolveSecret({ dataDir, production: false })).toBe(first);
    expect(readFileSync(join(dataDir, 'secret'), 'utf8').trim()).toBe(first);
  });

  it('prefers PARLEY_SECRET and requires it in production', () => {
    const dataDir = tempDir();
    expect(resolveSecret({ envSecret: 'e'.repeat(40), dataDir, production: true })).toBe('e'.repeat(40));
    expect(() => resolveSecret({ dataDir, production: true })).toThrow(/PARLEY_SECRET must be set/);
  });
});
