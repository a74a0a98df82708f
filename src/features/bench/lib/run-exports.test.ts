import { describe, expect, it } from 'vitest';
import { parseScenario, simulate } from '../../../../shared/sim/index.ts';
import { parseVector, runVector } from '../../../../shared/vectors/index.ts';
import { traceRecordSchema } from '../../../../shared/trace/record-schema.ts';
import { analyseRecords } from '../../../../shared/trace/index.ts';
import { defaultScenario } from './form-model.ts';
import { keySequence, traceJsonl, vectorFromRun, vectorIdOf } from './run-exports.ts';

function run(input: unknown) {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return simulate(parsed.scenario);
}

describe('run exports', () => {
  it('writes a trace the analyser reads back to the same contract', () => {
    const result = run(defaultScenario);
    const text = traceJsonl(result.events, { title: 'K65 bench run', seed: 1, simulatedAt: '2026-01-01T00:00:00Z' });
    const [header, ...lines] = text.trimEnd().split('\n');
    expect(JSON.parse(header!)).toMatchObject({ trace: 1, title: 'K65 bench run' });
    const records = lines.map((line) => traceRecordSchema.parse(JSON.parse(line)));
    expect(records).toHaveLength(result.events.length);
    expect(analyseRecords(records).contracts.at(-1)).toMatchObject(result.contract ?? {});
  });

  it('saves a negotiation vector that the vector runner passes', async () => {
    const result = run(defaultScenario);
    // Max power from the K65 on a 3 A cable: 20 V at 3 A = 60 W, object 4 (vector.md "max-power").
    expect(result.contract).toMatchObject({ kind: 'fixed', objectPosition: 4, voltageMv: 20_000, currentMa: 3_000 });
    const text = vectorFromRun(defaultScenario, result, { id: vectorIdOf('K65 max power!'), title: 'K65 max power' });
    const parsed = parseVector(text);
    if (!parsed.ok) throw new Error(parsed.error.message);
    expect(parsed.vector.id).toBe('negotiation/bench/k65-max-power');
    expect(parsed.vector.kind === 'negotiation' && parsed.vector.expect.sequence).toEqual(['Source_Capabilities', 'Request', 'Accept', 'PS_RDY']);
    expect(parsed.vector.kind === 'negotiation' && parsed.vector.expect.findings).toEqual({ exclude: ['*error'] });
    const verdict = await runVector(parsed.vector);
    expect(verdict.message ?? '').toBe('');
    expect(verdict.ok).toBe(true);
  });

  it('lists error findings to include when the run has some', async () => {
    const result = run({ ...defaultScenario, faults: [{ kind: 'silent', from: 'sink', atMs: 0 }] });
    expect(result.contract).toBeNull();
    const parsed = parseVector(vectorFromRun(defaultScenario, result, { id: 'negotiation/bench/x', title: 'x' }));
    if (!parsed.ok) throw new Error(parsed.error.message);
    expect(parsed.vector.kind === 'negotiation' && parsed.vector.expect.contract).toBeNull();
  });

  it('collapses repeats in the key sequence', () => {
    expect(keySequence([], undefined)).toEqual([]);
  });
});
