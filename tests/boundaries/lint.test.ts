import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';

const repo = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const biome = join(repo, 'node_modules', '.bin', 'biome');

/** Runs the linter with the repository's configuration over a folder; exit status and output. */
function lint(dir: string): { status: number; output: string } {
  try {
    const output = execFileSync(biome, ['lint', '--error-on-warnings', '--colors=off', '.'], { cwd: dir, encoding: 'utf8', stdio: 'pipe' });
    return { status: 0, output };
  } catch (error) {
    const failed = error as { status: number; stdout: string; stderr: string };
    return { status: failed.status, output: `${failed.stdout}${failed.stderr}` };
  }
}

describe('the linter (biome, with biome.jsonc)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'parley-lint-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  // The repository's rules (its whole-line comments dropped), without the git ignore file the temporary folder does not have.
  const text = readFileSync(join(repo, 'biome.jsonc'), 'utf8').replace(/^\s*\/\/.*$/gm, '');
  const config = JSON.parse(text) as { vcs?: unknown; $schema?: string };
  delete config.vcs;
  delete config.$schema;
  writeFileSync(join(dir, 'biome.json'), JSON.stringify(config));

  it('passes clean code', () => {
    writeFileSync(join(dir, 'clean.ts'), 'export const voltageMv = 5_000;\n');
    expect(lint(dir).status).toBe(0);
  });

  it('fails on a planted focused test and a debugger statement', () => {
    writeFileSync(join(dir, 'planted.test.ts'), "import { it } from 'vitest';\n\nit.only('runs alone', () => {\n  debugger;\n});\n");
    const { status, output } = lint(dir);
    expect(status).not.toBe(0);
    expect(output).toContain('lint/suspicious/noFocusedTests');
    expect(output).toContain('lint/suspicious/noDebugger');
  });

  it('fails on an unused import, an untyped `let`, an `any` outside tests and an assignment inside an expression', () => {
    writeFileSync(
      join(dir, 'planted-house.ts'),
      "import { join } from 'node:path';\n\nexport function last(values: any[]): number {\n  let found;\n  let count = 0;\n  while ((count = values.length) > 0) found = values.pop();\n  return found ?? count;\n}\n",
    );
    const { status, output } = lint(dir);
    expect(status).not.toBe(0);
    for (const rule of ['correctness/noUnusedImports', 'suspicious/noImplicitAnyLet', 'suspicious/noExplicitAny', 'suspicious/noAssignInExpressions']) expect(output).toContain(`lint/${rule}`);
  });
});
