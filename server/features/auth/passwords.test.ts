/**
 * Password hashing leaves room on libuv's thread pool: a burst of hashes (a sign-in flood) must not
 * queue file-system work behind it, or uploads and the health check's storage probe stall.
 */
import { stat } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { checkPassword, hashPassword } from './passwords.ts';

describe('password hashes', () => {
  it('check the password they were made from and refuse another', async () => {
    const hash = await hashPassword('correct horse battery');
    expect(hash).toMatch(/^scrypt\$15\$8\$1\$/);
    expect(await checkPassword('correct horse battery', hash)).toBe(true);
    expect(await checkPassword('correct horse batterY', hash)).toBe(false);
  });

  it('a burst of eight hashes leaves the thread pool free for a file-system call started after them', async () => {
    let hashed = 0;
    const burst = Array.from({ length: 8 }, () => hashPassword('flood attempt 0123').then(() => (hashed += 1)));
    // Queued behind eight scrypt calls on a four-thread pool, this would wait for at least four hashes.
    await stat('.');
    const hashedWhenStatDone = hashed;
    await Promise.all(burst);
    expect(hashedWhenStatDone).toBe(0);
    expect(hashed).toBe(8);
  });
});
