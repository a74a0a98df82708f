// A worker thread of bench/sweep.bench.ts: loads the bundled engine, then alternates short rounds of
// the baseline (bare simulate() of the campaign's scenarios) and of the sweep (runSlice of the
// plan), each a slice of CPU time, so load on the machine weighs on both alike; reports runs and milliseconds of each.
import { parentPort, workerData } from 'node:worker_threads';

const { engineUrl, scenarioInput, options, rounds, roundMs, warmMs } = workerData;
const engine = await import(engineUrl);
const parsed = engine.parseScenario(scenarioInput);
if (!parsed.ok) throw new Error(parsed.error.message);
const planned = engine.planSweep(parsed.scenario, options);
if (!planned.ok) throw new Error(planned.error.message);
const { plan } = planned;
const scenarios = plan.placements.map((p) => engine.scenarioFor(parsed.scenario, p));
const modes = {
  bare: () => {
    for (const s of scenarios) engine.simulate(s, { decode: false, analyze: false });
    return scenarios.length;
  },
  sweep: () => engine.runSlice(plan).runs.length,
};
const cpuMsSince = (cpu) => {
  const used = process.cpuUsage(cpu);
  return (used.user + used.system) / 1_000;
};
// Rounds last `ms` of CPU time, not of wall clock: on a busy machine a wall-clock round may get
// too little CPU to warm the JIT or to count.
const loop = (body, ms) => {
  let runs = 0;
  const cpu = process.cpuUsage();
  const start = performance.now();
  while (cpuMsSince(cpu) < ms) runs += body();
  return { runs, ms: performance.now() - start, cpuMs: cpuMsSince(cpu) };
};
loop(modes.bare, warmMs);
loop(modes.sweep, warmMs);
const totals = { bare: { runs: 0, ms: 0, cpuMs: 0 }, sweep: { runs: 0, ms: 0, cpuMs: 0 } };
for (let round = 0; round < rounds; round++) {
  for (const mode of ['bare', 'sweep']) {
    const r = loop(modes[mode], roundMs);
    totals[mode].runs += r.runs;
    totals[mode].ms += r.ms;
    totals[mode].cpuMs += r.cpuMs;
  }
}
parentPort.postMessage({ totals, campaign: { runs: plan.placements.length, messages: plan.messages.length, timerEdges: plan.placements.filter((p) => p.timers).length } });
