/**
 * Password hashes. New hashes are scrypt (Node's crypto, RFC 7914) run on libuv's thread pool, so a
 * flood of sign-ins never blocks the event loop; bcrypt hashes from older databases are still
 * checked (bcryptjs yields between rounds) and replaced by scrypt at the next good sign-in.
 */
import { randomBytes, scrypt as scryptCallback, timingSafeEqual, type ScryptOptions } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { z } from 'zod';

/**
 * scrypt N = 2^15, r = 8, p = 1: the interactive-login parameters in common use (about 32 MiB and
 * 50–100 ms per hash on a laptop core, common practice); the 32-byte key and 16-byte salt as well.
 */
const SCRYPT = { N: 2 ** 15, r: 8, p: 1, maxmem: 64 * 1024 * 1024 } as const;
const KEY_BYTES = 32;

export const passwordSchema = z.string().min(10, 'must be at least 10 characters').max(200, 'must be at most 200 characters');

/**
 * At most two hashes on libuv's pool (four threads unless UV_THREADPOOL_SIZE says otherwise) at once:
 * the pool also serves file reads, DNS and zlib, so a sign-in flood that filled it would stall
 * uploads, downloads and the health check's storage probe. The rest wait here, in order.
 */
const HASHES_AT_ONCE = 2;
let hashing = 0;
const waiting: Array<() => void> = [];

async function inHashSlot<T>(work: () => Promise<T>): Promise<T> {
  if (hashing >= HASHES_AT_ONCE) await new Promise<void>((resolve) => waiting.push(resolve));
  else hashing += 1;
  try {
    return await work();
  } finally {
    const next = waiting.shift();
    // The slot passes straight to the next waiter, so the count stays as it is.
    if (next) next();
    else hashing -= 1;
  }
}

function scrypt(password: string, salt: Buffer, options: ScryptOptions): Promise<Buffer> {
  return inHashSlot(() => new Promise<Buffer>((resolve, reject) => scryptCallback(password.normalize('NFKC'), salt, KEY_BYTES, options, (error, key) => (error ? reject(error) : resolve(key)))));
}

/** `scrypt$<log2 N>$<r>$<p>$<salt base64url>$<key base64url>`. */
export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await scrypt(password, salt, SCRYPT);
  return ['scrypt', Math.log2(SCRYPT.N), SCRYPT.r, SCRYPT.p, salt.toString('base64url'), key.toString('base64url')].join('$');
}

export async function checkPassword(password: string, hash: string): Promise<boolean> {
  if (hash.startsWith('scrypt$')) {
    const [, logN, r, p, salt, key] = hash.split('$');
    const expected = Buffer.from(key ?? '', 'base64url');
    if (expected.length !== KEY_BYTES) return false;
    const actual = await scrypt(password, Buffer.from(salt ?? '', 'base64url'), { N: 2 ** Number(logN), r: Number(r), p: Number(p), maxmem: SCRYPT.maxmem });
    return timingSafeEqual(actual, expected);
  }
  return bcrypt.compare(password, hash);
}

/** A hash from before scrypt: replace it once the password is known to be right. */
export const needsRehash = (hash: string) => !hash.startsWith('scrypt$');

/** A real hash to compare against when the account does not exist, so both paths take as long. */
export const decoyHash = 'scrypt$15$8$1$ZGVjb3ktc2FsdC1ub3QtdXNlZA$' + Buffer.alloc(KEY_BYTES, 1).toString('base64url');
