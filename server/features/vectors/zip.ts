/**
 * The library as a zip: a `vectors/` folder of `<id>.vector.json` files (the id's `/` are
 * folders), each exactly as stored. Entries are sorted and carry a fixed time, so the same
 * library always gives the same zip bytes; `parley run vectors` runs the unzipped folder.
 */
import { MAX_IMPORT_BYTES, MAX_IMPORT_FILES } from '../../../shared/api/index.ts';
import { strFromU8, strToU8, Unzip, UnzipInflate, UnzipPassThrough, zipSync, type Zippable } from 'fflate';
import { fail, type Result } from '../../../shared/core/result.ts';

export const ZIP_FOLDER = 'vectors';
/** DOS time stamps start in 1980; a fixed one keeps exports byte-stable. */
const FIXED_MTIME = new Date('2000-01-01T00:00:00Z');

export function libraryZip(files: readonly { vectorId: string; text: string }[]): Uint8Array {
  const entries: Zippable = {};
  for (const file of [...files].sort((a, b) => (a.vectorId < b.vectorId ? -1 : a.vectorId > b.vectorId ? 1 : 0))) {
    entries[`${ZIP_FOLDER}/${file.vectorId}.vector.json`] = [strToU8(file.text), { mtime: FIXED_MTIME }];
  }
  return zipSync(entries, { level: 6, mtime: FIXED_MTIME });
}

export type ZipRead = Result<{ files: { name: string; text: string }[] }>;

/** Compressed bytes handed to the inflater at a time: with DEFLATE's ~1:1032 ceiling, at most ~4 MB comes out of one push. */
const PUSH_BYTES = 4 * 1024;
const tooMuch = `file: the zip holds more than ${MAX_IMPORT_FILES} vectors or ${MAX_IMPORT_BYTES / 1024 / 1024} MB of them`;

/**
 * The `*.vector.json` entries of an uploaded zip (other entries are ignored). Inflated as a stream
 * with a running budget of the bytes that actually come out (an entry's declared size may lie), in
 * small pushes that give the event loop back between them.
 */
export async function readLibraryZip(bytes: Uint8Array, yieldToLoop: () => Promise<void> = () => new Promise((r) => setImmediate(r))): Promise<ZipRead> {
  const files: { name: string; text: string }[] = [];
  let total = 0;
  let count = 0;
  let failure: string | undefined;
  const unzip = new Unzip((file) => {
    if (failure || !file.name.endsWith('.vector.json') || file.name.includes('__MACOSX/')) return;
    count += 1;
    if (count > MAX_IMPORT_FILES) {
      failure = tooMuch;
      return;
    }
    const parts: Uint8Array[] = [];
    file.ondata = (error, chunk, final) => {
      if (failure) return;
      if (error) {
        failure = `file: not a readable zip archive (${error.message})`;
        return;
      }
      total += chunk.length;
      if (total > MAX_IMPORT_BYTES) {
        failure = tooMuch;
        file.terminate();
        return;
      }
      parts.push(chunk);
      if (final) {
        const whole = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
        let at = 0;
        for (const p of parts) {
          whole.set(p, at);
          at += p.length;
        }
        files.push({ name: file.name, text: strFromU8(whole) });
      }
    };
    try {
      file.start();
    } catch (error) {
      failure = `file: ${file.name} uses a compression this server does not read (${error instanceof Error ? error.message : String(error)})`;
    }
  });
  unzip.register(UnzipInflate);
  unzip.register(UnzipPassThrough);
  try {
    for (let at = 0; at < bytes.length && !failure; at += PUSH_BYTES) {
      unzip.push(bytes.subarray(at, at + PUSH_BYTES), at + PUSH_BYTES >= bytes.length);
      await yieldToLoop();
    }
  } catch (error) {
    failure ??= `file: not a readable zip archive (${error instanceof Error ? error.message : String(error)})`;
  }
  if (failure) return fail('vector.bad-zip', failure);
  if (bytes.length < 22 || !(bytes[0] === 0x50 && bytes[1] === 0x4b)) return fail('vector.bad-zip', 'file: not a readable zip archive (no zip signature)');
  if (files.length === 0) return fail('vector.bad-zip', 'file: the zip holds no *.vector.json files');
  files.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  return { ok: true, files };
}
