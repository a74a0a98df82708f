import { randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

/**
 * The key that signs session cookies: PARLEY_SECRET when set; in production it must be set; otherwise
 * a random key generated once into `<dataDir>/secret` (mode 0600) so sessions survive restarts.
 */
export function resolveSecret(options: { envSecret?: string; dataDir: string; production: boolean; shared?: boolean }): string {
  if (options.envSecret) return options.envSecret;
  if (options.production) throw new Error('PARLEY_SECRET must be set (32 characters or more) when NODE_ENV=production');
  // Several instances share one database: a key generated on one machine would sign out users on the others.
  if (options.shared) throw new Error('PARLEY_SECRET must be set (32 characters or more, the same on every instance) when DATABASE_URL is set');
  const file = join(options.dataDir, 'secret');
  mkdirSync(options.dataDir, { recursive: true });
  try {
    // 'wx' fails when the file exists, so two processes starting together keep the first one's key.
    writeFileSync(file, `${randomBytes(32).toString('hex')}\n`, { mode: 0o600, flag: 'wx' });
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
  }
  const secret = readFileSync(file, 'utf8').trim();
  if (secret.length < 32) throw new Error(`${file} holds a key shorter than 32 characters; delete it to make a new one`);
  return secret;
}
