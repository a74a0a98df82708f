import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { describeViolation, importGraph, violations } from './import-graph.ts';

const repo = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

describe('import boundaries', () => {
  it('hold in this repository', () => {
    const edges = importGraph(repo);
    // The graph is real: the scan sees the engine, the server and the client.
    expect(edges.length).toBeGreaterThan(1_000);
    expect(violations(edges).map(describeViolation)).toEqual([]);
  });

  describe('fail on planted violations', () => {
    const root = mkdtempSync(join(tmpdir(), 'parley-boundaries-'));
    afterAll(() => rmSync(root, { recursive: true, force: true }));
    const plant = (path: string, text: string) => {
      mkdirSync(dirname(join(root, path)), { recursive: true });
      writeFileSync(join(root, path), text);
    };
    plant('src/features/bench/routes/bench.tsx', "import { useTrace } from '../../traces/api/get-trace.ts';\nimport { Button } from '../../../components/button.tsx';\n");
    plant('src/features/traces/api/get-trace.ts', 'export const useTrace = 1;\n');
    plant('src/components/button.tsx', "export { runs } from '../features/runs/api/get-runs.ts';\n");
    plant('shared/pd/crc.ts', "import { bmc } from '../wire/bmc.ts';\n");
    plant('shared/wire/bmc.ts', "import { crc } from '../pd/crc.ts';\nexport const bmc = crc;\n");
    plant('shared/trace/read.ts', "import { readFileSync } from 'node:fs';\nimport { env } from '../../server/config/env.ts';\nimport * as React from 'react';\n");
    plant('shared/trace/read.test.ts', "import { readFileSync } from 'node:fs';\n");
    plant('shared/core/doc.ts', "/** Use it as `import { x } from '../sim/x.ts'`. */\nexport const doc = 1;\n");
    const found = violations(importGraph(root));

    it('a feature importing another feature', () => {
      expect(found).toContainEqual(expect.objectContaining({ from: 'src/features/bench/routes/bench.tsx', to: 'src/features/traces/api/get-trace.ts', line: 1 }));
    });
    it('shared UI importing a feature', () => {
      expect(found).toContainEqual(expect.objectContaining({ from: 'src/components/button.tsx', to: 'src/features/runs/api/get-runs.ts' }));
    });
    it('an engine folder importing against its direction (pd → wire), but not wire → pd', () => {
      expect(found).toContainEqual(expect.objectContaining({ from: 'shared/pd/crc.ts', to: 'shared/wire/bmc.ts', rule: 'shared/pd may import shared/core; not shared/wire' }));
      expect(found.filter((v) => v.from === 'shared/wire/bmc.ts')).toEqual([]);
    });
    it('the engine importing Node, the server or a package it may not use', () => {
      expect(found.filter((v) => v.from === 'shared/trace/read.ts').map((v) => v.to)).toEqual(['node:fs', 'server/config/env.ts', 'react']);
    });
    it('and nothing else: engine tests may use Node, comments are not imports, a feature may import shared UI', () => {
      expect(found).toHaveLength(6);
    });
  });
});
