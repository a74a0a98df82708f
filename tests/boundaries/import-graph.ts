/**
 * The import graph of the repository and the layering rules it must keep (DEVELOPERS.md, "Layout"):
 * features apart, the engine pure and self-contained, engine folders importing only downward.
 * Pure over a list of files, so a test can plant a violation in a made-up tree.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, normalize, relative, sep } from 'node:path';

export type ImportEdge = { from: string; to: string; line: number };
export type Violation = ImportEdge & { rule: string };

const SOURCE = /\.(ts|tsx|mjs|js)$/;
const SKIP = new Set(['node_modules', 'dist', 'build', 'data', 'tmp', '.git']);
const IMPORT = /(?:^|[\s;])(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|(?:^|[\s;(])import\s*(?:\(\s*)?['"]([^'"]+)['"]/g;

/** Every source file under the roots, as repository-relative paths with `/`. */
export function sourceFiles(rootDir: string, roots: readonly string[]): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    let entries: import('node:fs').Dirent[];
    try {
      entries = readdirSync(join(rootDir, dir), { withFileTypes: true });
    } catch {
      return;
    }
    for (const entry of entries) {
      if (SKIP.has(entry.name)) continue;
      const path = dir === '' ? entry.name : `${dir}/${entry.name}`;
      if (entry.isDirectory()) walk(path);
      else if (SOURCE.test(entry.name)) out.push(path);
    }
  };
  for (const root of roots) walk(root);
  return out.sort();
}

/** The imports of one file: relative ones resolved to repository paths, packages as written. */
export function importsOf(file: string, text: string): ImportEdge[] {
  const edges: ImportEdge[] = [];
  // Comments may quote imports (JSDoc examples); drop them, keeping line numbers.
  const code = text.replace(/\/\*[\s\S]*?\*\//g, (c) => c.replace(/[^\n]/g, ' ')).replace(/(^|[^:'"`])\/\/[^\n]*/g, '$1');
  for (const match of code.matchAll(IMPORT)) {
    const specifier = match[1] ?? match[2];
    if (!specifier) continue;
    const line = code.slice(0, match.index).split('\n').length;
    const to = specifier.startsWith('.')
      ? normalize(join(dirname(file), specifier))
          .split(sep)
          .join('/')
      : specifier;
    edges.push({ from: file, to, line });
  }
  return edges;
}

/** Engine folders and the engine folders each may import (DEVELOPERS.md layout table). */
export const engineDirections: Record<string, readonly string[]> = {
  core: [],
  pd: ['core'],
  wire: ['core', 'pd'],
  rules: ['core', 'pd'],
  trace: ['core', 'pd', 'wire', 'rules'],
  sim: ['core', 'pd', 'rules', 'trace'],
  sweep: ['core', 'pd', 'rules', 'trace', 'sim'],
  vectors: ['core', 'pd', 'wire', 'rules', 'trace', 'sim', 'sweep'],
  api: ['core', 'pd', 'rules', 'trace', 'sim', 'sweep', 'vectors'],
};

/** Packages the engine may use: pure, and safe in a Web Worker, the server and the CLI. */
export const enginePackages = ['zod', 'crc-32', 'fast-check', 'sucrase'];

const isTest = (file: string) => /\.test\.tsx?$/.test(file);
const featureOf = (path: string) => /^src\/features\/([^/]+)\//.exec(path)?.[1];
const engineFolderOf = (path: string) => /^shared\/([^/]+)\//.exec(path)?.[1];

function ruleBroken(edge: ImportEdge): string | null {
  const { from, to } = edge;
  const relativeTarget = !/^[@a-z]/i.test(to) || to.startsWith('src/') || to.startsWith('shared/') || to.startsWith('server/');
  const fromFeature = featureOf(from);
  const toFeature = featureOf(to);
  if (fromFeature && toFeature && fromFeature !== toFeature) return `features stay apart: src/features/${fromFeature} imports src/features/${toFeature}`;
  if ((from.startsWith('src/components/') || from.startsWith('src/lib/')) && toFeature) return 'src/components and src/lib are shared by features and import none of them';
  if (from.startsWith('src/features/') && to.startsWith('src/app/')) return 'features do not import the app shell';
  if (from.startsWith('shared/') && !isTest(from)) {
    if (relativeTarget && !to.startsWith('shared/')) return 'the engine (shared/) imports nothing outside shared/';
    if (!relativeTarget && !enginePackages.includes(to)) return `the engine (shared/) uses only the packages ${enginePackages.join(', ')}; not ${to}`;
  }
  const fromEngine = engineFolderOf(from);
  const toEngine = engineFolderOf(to);
  // Tests may borrow helpers from a higher layer (the sim's properties use the vectors' arbitraries).
  if (fromEngine && toEngine && fromEngine !== toEngine && !isTest(from)) {
    const allowed = engineDirections[fromEngine];
    if (allowed && !allowed.includes(toEngine))
      return `shared/${fromEngine} may import ${allowed.length > 0 ? allowed.map((d) => `shared/${d}`).join(', ') : 'no other engine folder'}; not shared/${toEngine}`;
  }
  if ((from.startsWith('server/') || from.startsWith('cli/')) && to.startsWith('src/')) return 'the server and the CLI do not import the client';
  return null;
}

/** Every import that breaks a rule, with the rule in words. */
export function violations(edges: readonly ImportEdge[]): Violation[] {
  return edges.flatMap((edge) => {
    const rule = ruleBroken(edge);
    return rule ? [{ ...edge, rule }] : [];
  });
}

/** The graph of a whole tree (the repository, or a test's planted one). */
export function importGraph(rootDir: string): ImportEdge[] {
  return sourceFiles(rootDir, ['shared', 'server', 'src', 'cli', 'workers']).flatMap((file) => importsOf(file, readFileSync(join(rootDir, file), 'utf8')));
}

export function describeViolation(v: Violation): string {
  return `${v.from}:${v.line} imports ${relative('.', v.to) || v.to}: ${v.rule}`;
}
