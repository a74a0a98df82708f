/**
 * `parley run` and `parley schema` in-process through runCli with a fake io (cli.md: output,
 * exit codes 0/1/2, --json, --filter, --junit). The JUnit file is checked by parsing it with
 * fast-xml-parser (common practice for JUnit readers: testsuites/testsuite/testcase/failure).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { afterAll, describe, expect, it } from 'vitest';
import { formatVector } from '../../shared/vectors/format.ts';
import { LIBRARY_DIR } from './support.ts';
import { runCaptured } from '../../cli/test-io.ts';

const cli = (args: string[], cwd = LIBRARY_DIR) => runCaptured(args, { cwd });

const scratch = mkdtempSync(join(tmpdir(), 'parley-run-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

const accept = {
  vector: 1,
  id: 'mine/accept',
  title: 'Accept',
  tags: [],
  ref: 'USB PD R3.1 V1.8 §6.3 Table 6-5 (from memory)',
  kind: 'decode',
  input: { hex: 'a303' },
  expect: { message: { header: { messageType: 'Accept' } } },
};
const wrong = { ...accept, id: 'mine/wrong', expect: { message: { header: { messageType: 'Reject' } } } };
// A property that fails, seeded: the same counterexample must come out of the worker pool.
const failingProperty = {
  vector: 1,
  id: 'mine/property',
  title: 'integers stay below 100',
  tags: [],
  ref: 'common practice',
  kind: 'property',
  input: { code: 'export default ({ fc }) => fc.property(fc.integer({ min: 0, max: 1000 }), (n: number) => { if (n >= 100) throw new Error("too big"); });', runs: 200, seed: 9 },
  expect: { holds: true },
};
writeFileSync(join(scratch, 'accept.vector.json'), formatVector(accept));
writeFileSync(join(scratch, 'wrong.vector.json'), formatVector(wrong));
writeFileSync(join(scratch, 'property.vector.json'), formatVector(failingProperty));
writeFileSync(join(scratch, 'broken.vector.json'), '{ "vector": 1, "id": ');
writeFileSync(join(scratch, 'not-a-vector.vector.json'), formatVector({ vector: 1, id: 'Bad Id', kind: 'decode' }));
writeFileSync(join(scratch, 'ignored.json'), '{}');

describe('parley run', () => {
  it('runs a folder of the library with --json', async () => {
    const { code, stdout } = await cli(['run', 'decode/control', '--json']);
    expect(code).toBe(0);
    const doc = JSON.parse(stdout);
    expect(doc).toMatchObject({ ok: true, passed: 11, failed: 0 });
    expect(doc.results[0]).toEqual({ id: 'decode/control/accept-from-source', ok: true });
  });

  it('filters by id glob and ends people output with exactly "N passed, M failed"', async () => {
    const { code, stdout } = await cli(['run', '.', '--filter', 'decode/control/re*']);
    expect(code).toBe(0);
    const lines = stdout.trimEnd().split('\n');
    expect(lines).toHaveLength(4);
    expect(lines.at(-1)).toBe('3 passed, 0 failed');
    expect(lines[0]).toMatch(/^PASS {2}decode\/control\/reject-from-source {2}\d+ ms$/);
  });

  it('reports broken files and mismatches as failures (exit 1), never a crash, and writes JUnit', async () => {
    const { code, stdout } = await cli(['run', '.', '--json', '--junit', 'out.xml'], scratch);
    expect(code).toBe(1);
    const doc = JSON.parse(stdout);
    expect(doc).toMatchObject({ ok: false, passed: 1, failed: 4 });
    const byId = Object.fromEntries(doc.results.map((r: { id: string }) => [r.id, r]));
    expect(byId['mine/wrong'].message).toBe('expect.message.header.messageType: expected "Reject", got "Accept"');
    expect(byId['broken.vector.json'].message).toMatch(/^broken\.vector\.json: not valid JSON/);
    expect(byId['not-a-vector.vector.json'].message).toMatch(/^not-a-vector\.vector\.json: id: lower-case words/);
    expect(byId['mine/property'].message).toMatch(/^expect\.holds: expected true, got false; counterexample after \d+ shrinks \(seed 9\): \[100\]; too big$/);

    const xml = readFileSync(join(scratch, 'out.xml'), 'utf8');
    expect(XMLValidator.validate(xml)).toBe(true);
    const suite = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(xml).testsuites.testsuite;
    expect(suite.testcase).toHaveLength(5);
    expect(suite.failures).toBe('4');
    const wrongCase = suite.testcase.find((c: { name: string }) => c.name === 'mine/wrong');
    expect(wrongCase.failure.message).toBe('expect.message.header.messageType: expected "Reject", got "Accept"');
  });

  it('gives the same property verdict in the worker pool as in this thread', async () => {
    const { runVector, parseVector } = await import('../../shared/vectors/run.ts');
    const parsed = parseVector(formatVector(failingProperty));
    if (!parsed.ok) throw new Error(parsed.error.message);
    const inline = await runVector(parsed.vector);
    const { stdout } = await cli(['run', 'property.vector.json', '--json'], scratch);
    expect(JSON.parse(stdout).results[0].message).toBe(inline.message);
  });

  it('exits 2 with a one-line reason for a missing path or a bad option', async () => {
    const missing = await cli(['run', 'no/such/folder']);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toBe('parley run: no such file or folder: no/such/folder\n');
    const json = await cli(['run', 'no/such/folder', '--json']);
    expect(JSON.parse(json.stdout)).toEqual({ ok: false, error: { code: 'input.path', message: 'no such file or folder: no/such/folder' } });
    expect((await cli(['run', '.', '--bogus'])).code).toBe(2);
    expect((await cli(['run'])).code).toBe(2);
    expect((await cli(['run', '.', '--filter', 'nothing/*'])).code).toBe(2);
  });
});

describe('parley schema', () => {
  it('prints the JSON Schemas of vector, scenario and trace', async () => {
    for (const name of ['vector', 'scenario', 'trace']) {
      const { code, stdout } = await cli(['schema', name]);
      expect(code).toBe(0);
      const schema = JSON.parse(stdout);
      expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
      expect(schema.title).toMatch(/^Parley /);
    }
    const trace = JSON.parse((await cli(['schema', 'trace'])).stdout);
    expect(trace.description).toMatch(/first line is a header/);
    expect(trace.$defs.header.properties.trace).toMatchObject({ const: 1 });
  });

  it('exits 2 for an unknown schema', async () => {
    const { code, stderr } = await cli(['schema', 'nope']);
    expect(code).toBe(2);
    expect(stderr).toBe('parley schema: no schema "nope"; give one of: vector, scenario, trace\n');
  });
});
