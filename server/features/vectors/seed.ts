/**
 * The team library of a new demo database: every built-in `vectors/**\/*.vector.json` file of
 * the repository, stored as revision 1 by the demo QA account with the file's own tags.
 */
import { existsSync } from 'node:fs';
import { readdir, readFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { User } from '../../db/entities.ts';
import { TeamVector, VectorRevision } from '../../db/library-entities.ts';
import type { Clock } from '../../context.ts';
import { parseVector, formatVector } from '../../../shared/vectors/index.ts';
import { tagsColumn } from './store.ts';

/** The repository's built-in library. */
export const builtInVectorsDir = resolve(fileURLToPath(new URL('../../../vectors', import.meta.url)));
export const demoLibraryAuthor = 'qa@kestrel.example';

async function vectorFiles(folder: string): Promise<string[]> {
  const entries = await readdir(folder, { withFileTypes: true });
  const files: string[] = [];
  for (const entry of entries.sort((a, b) => (a.name < b.name ? -1 : 1))) {
    const path = join(folder, entry.name);
    if (entry.isDirectory()) files.push(...(await vectorFiles(path)));
    else if (entry.isFile() && entry.name.endsWith('.vector.json')) files.push(path);
  }
  return files;
}

/** Stores the built-in vectors in an empty library; returns how many. Broken files are skipped. */
export async function seedTeamLibrary(em: EntityManager, clock: Clock, folder = builtInVectorsDir): Promise<number> {
  if (!existsSync(folder) || (await em.count(TeamVector)) > 0) return 0;
  const author = await em.findOne(User, { email: demoLibraryAuthor });
  if (!author) return 0;
  const now = clock.now();
  const seen = new Set<string>();
  const rows: { row: { id: number }; text: string }[] = [];
  for (const path of await vectorFiles(folder)) {
    const raw = await readFile(path, 'utf8');
    const parsed = parseVector(raw);
    if (!parsed.ok || seen.has(parsed.vector.id)) continue;
    seen.add(parsed.vector.id);
    const text = formatVector(JSON.parse(raw));
    const row = em.create(TeamVector, {
      vectorId: parsed.vector.id,
      title: parsed.vector.title,
      kind: parsed.vector.kind,
      tags: tagsColumn(parsed.vector.tags),
      text,
      revision: 1,
      deviceId: null,
      authorId: author.id,
      authorName: author.name,
      updatedById: author.id,
      updatedByName: author.name,
      createdAt: now,
      updatedAt: now,
    });
    rows.push({ row, text });
  }
  await em.flush();
  for (const { row, text } of rows) {
    em.create(VectorRevision, { vectorRowId: row.id, revision: 1, text, message: 'From the built-in library', authorId: author.id, authorName: author.name, createdAt: now });
  }
  await em.flush();
  return rows.length;
}
