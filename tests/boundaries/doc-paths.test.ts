import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const repo = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

/** Every `*.md` a source file or a document cites, with where it is cited. */
function citations(): { file: string; line: number; path: string }[] {
  const files = execFileSync('git', ['ls-files', '--cached', '--others', '--exclude-standard', '*.ts', '*.tsx', '*.mjs', '*.js', '*.md'], { cwd: repo, encoding: 'utf8' }).split('\n').filter(Boolean);
  const out: { file: string; line: number; path: string }[] = [];
  for (const file of files) {
    if (!existsSync(join(repo, file))) continue;
    readFileSync(join(repo, file), 'utf8')
      .split('\n')
      .forEach((text, index) => {
        // Markdown links and code comments cite pages by their file names.
        for (const match of text.matchAll(/(?<![\w/.-])((?:\.{1,2}\/|\/)?[\w./-]*[\w-]\.md)\b/g)) out.push({ file, line: index + 1, path: match[1]! });
      });
  }
  return out;
}

/** A cited path resolves from the repository root, from `docs/` (bare page names), or from the citing file. */
function resolves(file: string, path: string): boolean {
  if (path.startsWith('/')) return false;
  return [join(repo, path), join(repo, 'docs', path), join(repo, dirname(file), path)].some((candidate) => existsSync(candidate));
}

describe('document paths cited in code and docs', () => {
  const cited = citations();

  it('are many (the scan works)', () => {
    expect(cited.length).toBeGreaterThan(50);
  });

  it('all exist in the repository; none is a path outside it', () => {
    const broken = cited.filter((c) => !resolves(c.file, c.path)).map((c) => `${c.file}:${c.line} cites ${c.path}`);
    expect(broken).toEqual([]);
  });
});
