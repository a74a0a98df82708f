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

describe('the linter (biome, with biome.json)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'parley-lint-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  // The repository's rules, without the git ignore file the temporary folder does not have.
  const config = JSON.parse(readFileSync(join(repo, 'biome.json'), 'utf8')) as { vcs?: unknown; $schema?: string };
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
});
