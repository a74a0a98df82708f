/**
 * One truth between simulator and analyser (issue 11): over generated scenarios — compliant pairs,
 * and single faults the specification recovers from — the analyser, run on its own over the
 * simulated trace, reports no error, and its contract at every instant equals what both simulated
 * ports believe. Recoverable single faults: one lost GoodCRC or one corrupted message, which the
 * sender's retry repairs (USB PD R3.2 V1.1 §6.7.2 RetryCounter, §5.6.2 CRC).
 */
import fc from 'fast-check';
import type { Finding } from '../../shared/core/finding.ts';
import { CONTRACT_SETTLE_US, parseScenario, simulate } from '../../shared/sim/index.ts';
import { contractMismatches, type Mismatch } from '../../shared/trace/agreement.ts';
import { analyseRecords } from '../../shared/trace/index.ts';
import { arbitraries } from '../../shared/vectors/arbitraries.ts';

/**
 * The ports' claims may differ for CONTRACT_SETTLE_US, plus one retry when the GoodCRC for PS_RDY
 * is lost: tReceive (≤ 1.1 ms) then the PS_RDY again and its GoodCRC (about 1 ms) before the source
 * takes the contract (§6.7.2; common practice to allow 3 ms).
 */
const SETTLE_US = CONTRACT_SETTLE_US + 3_000;

export interface Verdict {
  errors: Finding[];
  mismatches: Mismatch[];
  contracts: number;
}

/** Scenarios: a third compliant, a third with one lost GoodCRC, a third with one corrupted message. */
export const oneTruthScenarios = (): fc.Arbitrary<unknown> =>
  fc.oneof(
    arbitraries.scenario(),
    arbitraries.scenario({ faults: ['drop-goodcrc'] }),
    fc
      .tuple(arbitraries.scenario(), fc.constantFrom('source' as const, 'sink' as const), fc.integer({ min: 1, max: 3 }))
      .map(([s, from, nth]) => ({ ...s, faults: [{ kind: 'corrupt' as const, from, nth }] })),
  );

export function judge(input: unknown): Verdict {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  const run = simulate(parsed.scenario, { analyze: false });
  const analysis = analyseRecords(run.events);
  const ports = run.ports.changes.map((c) => ({ tUs: c.tUs, side: c.side, contract: c.contract }));
  return {
    errors: analysis.findings.filter((f) => f.severity === 'error'),
    mismatches: contractMismatches(analysis.timeline.contracts, ports, run.endUs, SETTLE_US),
    contracts: analysis.contracts.length,
  };
}
