import { describe, expect, it } from 'vitest';
import type { Contract } from '../core/contract.ts';
import { disagreements, type PortView } from './port-views.ts';
import { parseScenario, simulate } from './index.ts';

const c9: Contract = { kind: 'fixed', objectPosition: 2, voltageMv: 9_000, currentMa: 3_000, powerMw: 27_000 };
const view = (tUs: number, side: 'source' | 'sink', contract: Contract | null): PortView => ({ tUs, side, state: 'x', contract, eprMode: false });

describe('disagreements', () => {
  it('ignores the hand-over window of one GoodCRC and reports longer differences', () => {
    const changes = [view(100, 'sink', c9), view(600, 'source', c9), view(10_000, 'sink', null)];
    const final = { source: view(10_000, 'source', c9), sink: view(10_000, 'sink', null) };
    expect(disagreements({ changes, final }, 50_000)).toEqual([{ startUs: 10_000, endUs: 50_000, source: c9, sink: null }]);
  });
});

describe('port views of a run', () => {
  it('shows both ports reaching the same contract and agreeing throughout', () => {
    const parsed = parseScenario({ source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, durationMs: 1_500 });
    if (!parsed.ok) throw new Error(parsed.error.message);
    const result = simulate(parsed.scenario);
    expect(result.ports.final.source).toMatchObject({ state: 'PE_SRC_Ready', contract: { voltageMv: 9_000 } });
    expect(result.ports.final.sink).toMatchObject({ state: 'PE_SNK_Ready', contract: { voltageMv: 9_000 } });
    expect(disagreements(result.ports, result.endUs)).toEqual([]);
    // The sink takes the contract at PS_RDY, the source at the GoodCRC for it (§8.3.3.3.6, §8.3.3.2.6).
    const sinkAt = result.ports.changes.find((c) => c.side === 'sink' && c.contract)!.tUs;
    const sourceAt = result.ports.changes.find((c) => c.side === 'source' && c.contract)!.tUs;
    expect(sourceAt - sinkAt).toBeGreaterThan(0);
    expect(sourceAt - sinkAt).toBeLessThan(2_000);
    expect(result.timeline?.contracts[0]?.contract.voltageMv).toBe(9_000);
  });
});
