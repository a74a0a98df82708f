/**
 * The Properties page's demonstration of a failing property: the code plants a bug in its own copy
 * of the simulator (the engine is a plain object, so a property can swap one function), and the
 * property catches it and shrinks the scenario to a small one. Not a library vector: the bug lives
 * only in this example's code.
 */
export const plantedBugExample = {
  vector: 1,
  id: 'property/demo/planted-bug-contract-above-offer',
  title: 'Planted bug: a simulator copy that contracts 50 mA above the offer from 15 V up (fails and shrinks)',
  tags: ['demo', 'planted-bug'],
  ref: "USB PD R3.1 V1.8 §6.4.2 (the RDO's operating current is within the referenced PDO) (from memory)",
  kind: 'property',
  input: {
    code: `export default ({ fc, engine }: PropertyContext) => {
  // The planted bug: this copy of the simulator reports a contract 50 mA above what the source
  // offered whenever the contract is at 15 V or more. Use engine.sim.simulate and it holds.
  const simulate: typeof engine.sim.simulate = (scenario, options) => {
    const result = engine.sim.simulate(scenario, options);
    if (result.contract === null || result.contract.voltageMv < 15_000) return result;
    return { ...result, contract: { ...result.contract, currentMa: result.contract.currentMa + 50 } };
  };
  return fc.property(engine.arbitraries.scenario({ durationMs: 1_000 }), (input) => {
    const parsed = engine.sim.parseScenario(input);
    if (!parsed.ok) throw new Error(parsed.error.message);
    const { contract } = simulate(parsed.scenario);
    if (contract === null) return;
    const hex = input.source.caps.pdos[contract.objectPosition - 1] ?? '0';
    const offer = engine.codec.decodeSourcePdo(Number.parseInt(hex, 16) >>> 0);
    if (offer.kind === 'fixed' && contract.currentMa > offer.maxCurrentMa) {
      throw new Error(\`a contract of \${contract.currentMa} mA on an offer of \${offer.maxCurrentMa} mA at \${offer.voltageMv} mV\`);
    }
  });
};
`,
    runs: 100,
    seed: 9,
  },
  expect: { holds: false },
} as const;
