/** Loads the built-in vector library (../../vectors) for the tests and the benchmark. */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const LIBRARY_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '../../vectors');

export interface LibraryFile {
  /** Path relative to the library folder, `/`-separated. */
  path: string;
  absolute: string;
  text: string;
}

export function libraryFiles(root = LIBRARY_DIR): LibraryFile[] {
  const files: LibraryFile[] = [];
  const walk = (folder: string) => {
    for (const entry of readdirSync(folder, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : 1))) {
      const absolute = join(folder, entry.name);
      if (entry.isDirectory()) walk(absolute);
      else if (entry.name.endsWith('.vector.json')) files.push({ path: relative(root, absolute).split('\\').join('/'), absolute, text: readFileSync(absolute, 'utf8') });
    }
  };
  walk(root);
  return files;
}

export interface KnownFailure {
  id: string;
  reason: string;
}

export function knownFailures(root = LIBRARY_DIR): KnownFailure[] {
  return JSON.parse(readFileSync(join(root, 'known-failing.json'), 'utf8')) as KnownFailure[];
}
