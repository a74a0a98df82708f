/**
 * The editor's declarations stay in step with the engine: they are emitted from the source at build
 * time, and this test checks that every key of every facade group is declared, that the files the
 * declarations import are all there, and that the fast-check and zod types came along.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { engine } from '../../../../shared/vectors/engine-facade.ts';
import { buildEngineTypes, engineRoot, rewriteTsSpecifiers } from './build-engine-types.ts';

const repoRoot = fileURLToPath(new URL('../../../..', import.meta.url));

describe('buildEngineTypes', () => {
  it('declares every key of the engine facade, with what its imports need', async () => {
    const declarations = await buildEngineTypes(repoRoot);
    const byPath = new Map(declarations.map((d) => [d.filePath, d.content]));
    const facade = byPath.get(`${engineRoot}/shared/vectors/engine-facade.d.ts`);
    expect(facade).toBeDefined();
    for (const [group, members] of Object.entries(engine)) {
      expect(facade, group).toMatch(new RegExp(`\\b${group}: \\{`));
      for (const key of Object.keys(members)) expect(facade, `engine.${group}.${key}`).toMatch(new RegExp(`\\b${key}\\??:`));
    }
    // Every relative import resolves to a declaration that is shipped.
    for (const { filePath, content } of declarations) {
      for (const match of content.matchAll(/(?:from|import)\s*\(?\s*['"](\.{1,2}\/[^'"]+)['"]/g)) {
        const target = new URL(match[1]!.replace(/\.js$/, ''), filePath).href;
        const found = byPath.has(`${target}.d.ts`) || byPath.has(`${target}/index.d.ts`);
        expect(found, `${filePath} imports ${match[1]}`).toBe(true);
      }
    }
    expect(byPath.get('file:///node_modules/fast-check/index.d.ts')).toContain('declare function property');
    expect(byPath.has('file:///node_modules/pure-rand/types/RandomGenerator.d.ts')).toBe(true);
    expect(byPath.get('file:///node_modules/zod/index.d.ts')).toContain('v4/classic/external.js');
    expect(byPath.get('file:///parley/property-context.d.ts')).toContain('type PropertyContext');
  });

  it('rewrites .ts import specifiers to .js and leaves packages alone', () => {
    expect(rewriteTsSpecifiers(`import type { A } from '../pd/types.ts';\nexport * from "./x.ts";\ntype B = import('./y.ts').B;\nimport { z } from 'zod';`)).toBe(
      `import type { A } from '../pd/types.js';\nexport * from "./x.js";\ntype B = import('./y.js').B;\nimport { z } from 'zod';`,
    );
  });
});
