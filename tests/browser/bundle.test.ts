import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { distDir, requireDist } from './support.ts';

type ManifestChunk = {
  file: string;
  src?: string;
  isEntry?: boolean;
  isDynamicEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
  css?: string[];
};

function readManifest(): Record<string, ManifestChunk> {
  requireDist();
  return JSON.parse(readFileSync(join(distDir, '.vite', 'manifest.json'), 'utf8')) as Record<string, ManifestChunk>;
}

/** Every file the first page loads before any lazy route: the entry and its static imports. */
function firstPageFiles(manifest: Record<string, ManifestChunk>): string[] {
  const seen = new Set<string>();
  const visit = (key: string) => {
    if (seen.has(key)) return;
    seen.add(key);
    for (const next of manifest[key]?.imports ?? []) visit(next);
  };
  visit('index.html');
  return [...seen].map((key) => manifest[key]?.file ?? '');
}

// A check of the production build (dist/), no browser needed: npm test builds before it runs.
describe('the built client', () => {
  it('puts Monaco in a lazy chunk of its own, with its workers beside it', () => {
    const manifest = readManifest();
    const editor = Object.entries(manifest).find(([key]) => key.endsWith('src/components/code-editor-monaco.tsx'));
    expect(editor, 'the Monaco editor chunk').toBeDefined();
    const [, chunk] = editor!;
    expect(chunk.isDynamicEntry).toBe(true);
    expect(existsSync(join(distDir, chunk.file))).toBe(true);
    // Monaco is the bulk of that chunk: well over 1 MB before compression.
    expect(statSync(join(distDir, chunk.file)).size).toBeGreaterThan(1_000_000);
    expect(readFileSync(join(distDir, chunk.file), 'utf8')).toContain('MonacoEnvironment');

    const assets = readdirSync(join(distDir, 'assets'));
    for (const worker of ['editor.worker', 'json.worker', 'ts.worker']) {
      expect(
        assets.some((name) => name.startsWith(`${worker}-`) && name.endsWith('.js')),
        worker,
      ).toBe(true);
    }
  });

  it('keeps Monaco and charts out of the first page, and the first page small', () => {
    const manifest = readManifest();
    const files = firstPageFiles(manifest);
    let gzipBytes = 0;
    for (const file of files) {
      const text = readFileSync(join(distDir, file), 'utf8');
      expect(text, file).not.toContain('MonacoEnvironment');
      expect(text, file).not.toContain('recharts');
      gzipBytes += gzipSync(text).length;
    }
    // Measured at about 115 KB gzip when written; the limit leaves room for growth, not for Monaco (~1 MB).
    expect(gzipBytes).toBeLessThan(200_000);
  });

  it('ships its fonts and loads nothing from elsewhere', () => {
    const assets = readdirSync(join(distDir, 'assets'));
    expect(assets.some((name) => name.startsWith('inter-latin-wght-normal') && name.endsWith('.woff2'))).toBe(true);
    expect(assets.some((name) => name.startsWith('jetbrains-mono-latin-400-normal') && name.endsWith('.woff2'))).toBe(true);
    const html = readFileSync(join(distDir, 'index.html'), 'utf8');
    expect(html).not.toMatch(/(src|href)="(https?:)?\/\//);
    expect(html).toMatch(/src="\/assets\/index-[\w-]+\.js"/);
  });
});
