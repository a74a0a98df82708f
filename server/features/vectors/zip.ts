/**
 * The library as a zip: a `vectors/` folder of `<id>.vector.json` files (the id's `/` are
 * folders), each exactly as stored. Entries are sorted and carry a fixed time, so the same
 * library always gives the same zip bytes; `parley run vectors` runs the unzipped folder.
 */
import { MAX_IMPORT_BYTES, MAX_IMPORT_FILES } from '../../../shared/api/index.ts';
import { strFromU8, strToU8, unzipSync, zipSync, type Zippable } from 'fflate';
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

/** The `*.vector.json` entries of an uploaded zip (other entries are ignored), with size guards. */
export function readLibraryZip(bytes: Uint8Array): ZipRead {
  let count = 0;
  let total = 0;
  let tooBig = false;
  let unzipped: Record<string, Uint8Array>;
  try {
    unzipped = unzipSync(bytes, {
      filter: (file) => {
        if (!file.name.endsWith('.vector.json') || file.name.includes('__MACOSX/')) return false;
        count += 1;
        total += file.originalSize;
        if (count > MAX_IMPORT_FILES || total > MAX_IMPORT_BYTES) tooBig = true;
        return !tooBig;
      },
    });
  } catch (error) {
    return fail('vector.bad-zip', `file: not a readable zip archive (${error instanceof Error ? error.message : String(error)})`);
  }
  if (tooBig) return fail('vector.bad-zip', `file: the zip holds more than ${MAX_IMPORT_FILES} vectors or ${MAX_IMPORT_BYTES / 1024 / 1024} MB of them`);
  const files = Object.entries(unzipped)
    .map(([name, data]) => ({ name, text: strFromU8(data) }))
    .sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  if (files.length === 0) return fail('vector.bad-zip', 'file: the zip holds no *.vector.json files');
  return { ok: true, files };
}
