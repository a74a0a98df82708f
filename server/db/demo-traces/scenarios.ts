/**
 * The demo traces: invented captures of the fictional Kestrel devices (seed.ts), one clean and
 * each of the others showing one fault a support engineer meets. Times are invented but kept
 * inside (or, for the fault, outside) the limits of shared/core/timers.ts.
 */
import { demoDevices } from '../seed.ts';
import { capsObjects, createJitter, createScript, fixedRdo, ppsRdo, toJsonLines, toText, type DemoScript } from './build.ts';

export interface DemoTrace {
  fileName: string;
  title: string;
  /** The demo device (model) the trace was captured on. */
  deviceModel: string;
  customerRef: string;
  notes: string;
  /** Rule ids the analysis must report (the seed test checks them). */
  expectRules: string[];
  content: string;
}

const pdosOf = (model: string): string[] => demoDevices.find((d) => d.model === model)!.pdos;

/** Attach with Rp 3.0 A, then vSafe5V on VBUS. */
function attach(s: DemoScript, jitter: (spread: number) => number): void {
  s.records.push({ t: 0, event: 'attach', cc: 'CC1', rp: '3.0A' });
  for (let t = 40_000; t < 180_000; t += 50_000) s.vbus(t, 5_020 + jitter(15), 90 + jitter(10));
}

/** Source_Capabilities → Request → Accept; returns the end of the Accept's GoodCRC. */
function offerAndRequest(s: DemoScript, tCapsUs: number, model: string, rdo: ReturnType<typeof fixedRdo>, requestDelayUs = 2_400): number {
  const capsEnd = s.send(tCapsUs, 'source', 'Source_Capabilities', capsObjects(pdosOf(model)));
  const requestEnd = s.send(capsEnd + requestDelayUs, 'sink', 'Request', [rdo]);
  return s.send(requestEnd + 1_700, 'source', 'Accept');
}

/** VBUS moves from `fromMv` to `toMv` over `rampUs` starting at `t`; readings every 20 ms. */
function ramp(s: DemoScript, t: number, rampUs: number, fromMv: number, toMv: number): void {
  for (let dt = 0; dt <= rampUs; dt += 20_000) s.vbus(t + dt, Math.round(fromMv + ((toMv - fromMv) * dt) / rampUs), 80);
}

/** Steady readings every `everyUs` from `t` to `endUs` around `mv` and `ma`. */
function steady(s: DemoScript, jitter: (spread: number) => number, t: number, endUs: number, mv: number, ma: number, everyUs = 250_000): void {
  for (let at = t; at < endUs; at += everyUs) s.vbus(at, mv + jitter(40), ma + jitter(60));
}

function cleanK65(): DemoTrace {
  const s = createScript();
  const jitter = createJitter(65);
  attach(s, jitter);
  const acceptEnd = offerAndRequest(s, 180_000, 'K65', fixedRdo(4, 3_250));
  ramp(s, acceptEnd + 30_000, 160_000, 5_000, 20_000);
  const psRdyEnd = s.send(acceptEnd + 230_000, 'source', 'PS_RDY');
  steady(s, jitter, psRdyEnd + 50_000, 30_000_000, 20_040, 3_050);
  return {
    fileName: 'k65-wren14-bench.trace.jsonl',
    title: 'K65 with Wren 14 on bench 2',
    deviceModel: 'K65',
    customerRef: 'KD-LAB-0001',
    notes: 'Reference capture: the laptop takes 20 V 3.25 A and charges at full speed.',
    expectRules: [],
    content: toJsonLines({ title: 'K65 with Wren 14 on bench 2', capturedAt: '2026-11-30T09:12:00Z' }, s.records),
  };
}

function lateRequest(): DemoTrace {
  const s = createScript();
  const jitter = createJitter(14);
  attach(s, jitter);
  // The sink answers 38 ms after the offer: later than tSenderResponse (33 ms at most).
  const acceptEnd = offerAndRequest(s, 180_000, 'D100', fixedRdo(4, 3_250), 38_000);
  ramp(s, acceptEnd + 30_000, 160_000, 5_000, 20_000);
  const psRdyEnd = s.send(acceptEnd + 230_000, 'source', 'PS_RDY');
  steady(s, jitter, psRdyEnd + 50_000, 12_000_000, 20_020, 3_100, 500_000);
  return {
    fileName: 'wren14-late-request.txt',
    title: 'Wren 14 answers the offer late',
    deviceModel: 'Wren 14',
    customerRef: 'KD-CASE-2291',
    notes: 'Customer reports the laptop sometimes falls back to slow charging on the D100 after waking up.',
    expectRules: ['timing.sender-response'],
    content: toText('Wren 14 on a D100, firmware console log', s.records),
  };
}

function ppsKeepAlive(): DemoTrace {
  const s = createScript();
  const jitter = createJitter(3);
  attach(s, jitter);
  const acceptEnd = offerAndRequest(s, 180_000, 'K65', ppsRdo(5, 9_000, 2_000));
  ramp(s, acceptEnd + 30_000, 100_000, 5_000, 9_000);
  let t = s.send(acceptEnd + 150_000, 'source', 'PS_RDY');
  steady(s, jitter, t + 50_000, 8_000_000, 9_010, 1_950);
  // One keep-alive Request at 8 s, then the sink goes quiet: no Request within tPPSRequest (10 s).
  t = s.send(8_000_000, 'sink', 'Request', [ppsRdo(5, 9_000, 2_000)]);
  t = s.send(t + 1_700, 'source', 'Accept');
  t = s.send(t + 40_000, 'source', 'PS_RDY');
  steady(s, jitter, t + 50_000, 21_000_000, 9_010, 1_950);
  s.note(20_990_000, 'charging icon goes off');
  // The source gives up after tPPSTimeout and sends a Hard Reset (USB PD R3.2 V1.1 §6.6, Time Values table).
  s.event(21_100_000, 'hard_reset', 'source');
  s.resetIds();
  ramp(s, 21_130_000, 500_000, 9_000, 0);
  ramp(s, 22_400_000, 200_000, 0, 5_000);
  // First offers within tFirstSourceCap (250 ms) of VBUS reaching vSafe5V at 22.6 s (§7.1.5, Time Values table).
  const again = offerAndRequest(s, 22_750_000, 'K65', ppsRdo(5, 9_000, 2_000));
  ramp(s, again + 30_000, 100_000, 5_000, 9_000);
  t = s.send(again + 150_000, 'source', 'PS_RDY');
  steady(s, jitter, t + 50_000, 26_000_000, 9_010, 1_950);
  return {
    fileName: 'k65-pps-stops.trace.jsonl',
    title: 'K65 drops a programmable contract',
    deviceModel: 'K65',
    customerRef: 'KD-CASE-2304',
    notes: 'Phone on fast charge: charging stops for a second about every 20 s.',
    expectRules: ['timing.pps-keepalive', 'protocol.hard-reset'],
    content: toJsonLines({ title: 'K65 PPS 9 V, field capture', capturedAt: '2026-11-28T16:40:00Z' }, s.records),
  };
}

function vbusSag(): DemoTrace {
  const s = createScript();
  const jitter = createJitter(100);
  attach(s, jitter);
  const acceptEnd = offerAndRequest(s, 180_000, 'D100', fixedRdo(4, 3_250));
  ramp(s, acceptEnd + 30_000, 160_000, 5_000, 20_000);
  const psRdyEnd = s.send(acceptEnd + 230_000, 'source', 'PS_RDY');
  steady(s, jitter, psRdyEnd + 50_000, 5_000_000, 20_010, 1_200);
  // Under load VBUS sinks to about 18.5 V: below 19 V, the fixed contract's 95 %.
  for (let t = 5_000_000; t < 25_000_000; t += 250_000) {
    const loadMa = Math.min(3_200, 1_200 + Math.round((t - 5_000_000) / 1_000));
    s.vbus(t, 20_010 - Math.round(loadMa * 0.47) + jitter(40), loadMa + jitter(40));
  }
  s.note(25_000_000, 'laptop shows "charging slowly"');
  return {
    fileName: 'd100-vbus-sag.trace.jsonl',
    title: 'D100 output sags under load',
    deviceModel: 'D100',
    customerRef: 'KD-CASE-2312',
    notes: 'Wren 14 says "charging slowly" on the desk charger; fine on the K65.',
    expectRules: ['vbus.out-of-range'],
    content: toJsonLines({ title: 'D100 with Wren 14, 20 V under load', capturedAt: '2026-11-29T11:05:00Z' }, s.records),
  };
}

function missingGoodCrc(): DemoTrace {
  const s = createScript();
  const jitter = createJitter(7);
  attach(s, jitter);
  const capsEnd = s.send(180_000, 'source', 'Source_Capabilities', capsObjects(pdosOf('K65')));
  // The source never acknowledges the Request: the sink retries it twice (nRetryCount = 2) and gives up.
  let t = capsEnd + 2_400;
  for (let attempt = 0; attempt < 3; attempt++) t = s.send(t, 'sink', 'Request', [fixedRdo(4, 3_250)], { ack: false }) + 1_200;
  s.event(capsEnd + 31_000, 'hard_reset', 'source');
  s.resetIds();
  ramp(s, capsEnd + 60_000, 400_000, 5_000, 0);
  ramp(s, capsEnd + 1_300_000, 200_000, 0, 5_000);
  const acceptEnd = offerAndRequest(s, capsEnd + 1_700_000, 'K65', fixedRdo(4, 3_250));
  ramp(s, acceptEnd + 30_000, 160_000, 5_000, 20_000);
  const psRdyEnd = s.send(acceptEnd + 230_000, 'source', 'PS_RDY');
  steady(s, jitter, psRdyEnd + 50_000, 10_000_000, 20_030, 3_000, 500_000);
  return {
    fileName: 'wren14-missing-goodcrc.txt',
    title: 'Request not acknowledged at first attach',
    deviceModel: 'Wren 14',
    customerRef: 'KD-CASE-2320',
    notes: 'The laptop blinks its charge light once when plugged into the K65, then charges.',
    expectRules: ['protocol.missing-goodcrc', 'protocol.hard-reset'],
    content: toText('Wren 14 on a K65, first attach after boot', s.records),
  };
}

function latePsRdy(): DemoTrace {
  const s = createScript();
  const jitter = createJitter(21);
  attach(s, jitter);
  const acceptEnd = offerAndRequest(s, 180_000, 'K65', fixedRdo(3, 3_000));
  ramp(s, acceptEnd + 30_000, 600_000, 5_000, 15_000);
  // PS_RDY 720 ms after Accept: later than tPSTransition (550 ms at most).
  const psRdyEnd = s.send(acceptEnd + 720_000, 'source', 'PS_RDY');
  steady(s, jitter, psRdyEnd + 50_000, 15_000_000, 15_030, 2_800);
  return {
    fileName: 'k65-late-ps-rdy.trace.jsonl',
    title: 'K65 takes long to reach 15 V',
    deviceModel: 'K65',
    customerRef: 'KD-CASE-2335',
    notes: 'A batch of K65 units: some sinks give up and stay at 5 V.',
    expectRules: ['timing.ps-transition'],
    content: toJsonLines({ title: 'K65 unit 0413, 15 V request', capturedAt: '2026-11-27T14:22:00Z' }, s.records),
  };
}

/** Every demo trace, in the order the seed stores them (oldest first). */
export function buildDemoTraces(): DemoTrace[] {
  return [cleanK65(), lateRequest(), ppsKeepAlive(), vbusSag(), missingGoodCrc(), latePsRdy()];
}
