/**
 * The checks added in the second version, each on a capture built from the specification (the
 * scenes of tests/fixtures/traces/spec-scenes.ts) with the fault in one place, and on the same
 * capture without it. Timer values: shared/core/timers.ts (USB PD R3.2 V1.1 Time Values table).
 */
import { describe, expect, it } from 'vitest';
import { acked, capture, pdHex, pdoWord, type Exchange } from '../../tests/fixtures/traces/spec-build.ts';
import { avsRdo, cableDiscovery, eprOffers, eprScene, fixedRdo, keepAlives, sprCaps, sprContract } from '../../tests/fixtures/traces/spec-scenes.ts';
import { fixedPdo, ppsApdo } from '../rules/pdo-builders.ts';
import { analyseRecords } from './analyser.ts';
import type { TraceRecord } from './records.ts';

const analyse = (steps: (Exchange | TraceRecord)[]) => analyseRecords(capture(steps));
const rulesOf = (steps: (Exchange | TraceRecord)[]) => analyse(steps).findings.map((f) => f.rule);
const errorsOf = (steps: (Exchange | TraceRecord)[]) =>
  analyse(steps)
    .findings.filter((f) => f.severity === 'error')
    .map((f) => `${f.rule}: ${f.message}`);

describe('timing.receiver-response (tReceiverResponse 15 ms, §6.6.2 / Time Values)', () => {
  it('warns when the sink begins its Request 20 ms after the offers were acknowledged', () => {
    const found = analyse(sprContract(100_000, 20_000)).findings;
    expect(found.filter((f) => f.rule === 'timing.receiver-response')).toMatchObject([{ severity: 'warning' }]);
    expect(found.filter((f) => f.severity === 'error')).toEqual([]);
  });
  it('is quiet at 10 ms, and a late answer past tSenderResponse is the error instead', () => {
    expect(rulesOf(sprContract(100_000, 10_000))).not.toContain('timing.receiver-response');
    const late = rulesOf(sprContract(100_000, 40_000));
    expect(late).toContain('timing.sender-response');
    expect(late).not.toContain('timing.receiver-response');
  });
});

describe('timing.sink-request (tSinkRequest ≥ 100 ms after Wait, §6.6.4.2)', () => {
  const afterWait = (gapUs: number, newCaps = false): Exchange[] => [
    ...acked(sprCaps(0), 'source', 0),
    ...acked(pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(2, 3_000)] }), 'sink', 0, 3_000),
    ...acked(pdHex('Wait', { id: 1, from: 'source' }), 'source', 1, 2_000),
    ...(newCaps ? acked(sprCaps(2), 'source', 2, gapUs / 2) : []),
    ...acked(pdHex('Request', { id: 1, from: 'sink', objects: [fixedRdo(2, 3_000)] }), 'sink', 1, newCaps ? 3_000 : gapUs),
    ...acked(pdHex('Accept', { id: newCaps ? 3 : 2, from: 'source' }), 'source', newCaps ? 3 : 2, 2_000),
  ];
  it('is an error 50 ms after Wait', () => {
    expect(rulesOf(afterWait(50_000))).toContain('timing.sink-request');
  });
  it('is quiet at 150 ms, or after new Source_Capabilities', () => {
    expect(rulesOf(afterWait(150_000))).not.toContain('timing.sink-request');
    expect(rulesOf(afterWait(50_000, true))).not.toContain('timing.sink-request');
  });
});

describe('EPR mode (§6.4.9, §8.3.3.26)', () => {
  it('a compliant entry with keep-alives every 400 ms has no errors', () => {
    expect(errorsOf([...eprScene(), ...keepAlives(5, 400_000, 4, 1)])).toEqual([]);
  });
  it('timing.epr-keepalive: none within tSinkEPRKeepAlive (500 ms) while EPR holds', () => {
    const steps = [...eprScene(), { t: 3_000_000, vbus: { mv: 28_000 } }];
    expect(rulesOf(steps)).toContain('timing.epr-keepalive');
  });
  it("names the stopped keep-alives as the cause of the source's Hard Reset", () => {
    const scene = capture(eprScene());
    const end = scene[scene.length - 1]!.t;
    const a = analyseRecords([...scene, { t: end + 900_000, event: 'hard_reset', from: 'source' }]);
    expect(a.hardResets[0]?.cause).toMatch(/no EPR_KeepAlive/);
    expect(a.findings.find((f) => f.rule === 'timing.epr-keepalive')?.message).toMatch(/Hard Reset followed/);
  });
  it('epr.entry: EPR offers and EPR_Request without EPR_Mode (Enter Succeeded)', () => {
    const found = analyse(eprScene({ skipEntry: true })).findings.filter((f) => f.rule === 'epr.entry');
    expect(found.map((f) => f.message)).toEqual([expect.stringMatching(/EPR_Source_Capabilities .* outside EPR mode/), expect.stringMatching(/EPR_Request .* outside EPR mode/)]);
  });
  it('epr.entry: EPR entered over a cable whose e-marker is not EPR capable', () => {
    const withCable = (epr: boolean) => {
      const scene = eprScene();
      return [...scene.slice(0, 8), ...cableDiscovery(5_000, epr), ...scene.slice(8)];
    };
    expect(
      analyse(withCable(false))
        .findings.filter((f) => f.rule === 'epr.entry')
        .map((f) => f.message),
    ).toEqual([expect.stringMatching(/not|5 A, 50 V passive cable/)]);
    expect(rulesOf(withCable(true))).not.toContain('epr.entry');
  });
  it('checks the reassembled EPR_Source_Capabilities against the EPR Power Rules', () => {
    // 140 W EPR: 28 V 5 A is required (§10.2.3.x EPR Power Rules, from memory); here it is missing.
    const offers = [...eprOffers.slice(0, 7), fixedPdo(28_000, 3_000), eprOffers[8]!];
    const found = analyse(eprScene({ offers, request: { rdo: fixedRdo(8, 3_000, true), copy: pdoWord(offers[7]!) } })).findings;
    expect(found.map((f) => f.rule)).toContain('caps.power-rules-current');
  });
  it('request.epr-copy: the copy is not the object at that position', () => {
    const found = analyse(eprScene({ request: { rdo: fixedRdo(8, 5_000, true), copy: pdoWord(fixedPdo(28_000, 3_000)) } })).findings;
    expect(found.filter((f) => f.rule === 'request.epr-copy')).toMatchObject([{ severity: 'error', object: 8 }]);
  });
  it('AVS EPR_Request: 100 mV steps, at most the lower of 5 A and PDP/V', () => {
    const avs = (mv: number, ma: number) => analyse(eprScene({ request: { rdo: avsRdo(9, mv, ma), copy: pdoWord(eprOffers[8]!) } })).findings.map((f) => f.rule);
    expect(avs(20_000, 5_000)).not.toContain('request.exceeds-offer');
    expect(avs(20_000, 5_000)).not.toContain('request.out-of-range');
    expect(avs(20_050, 3_000)).toContain('request.out-of-range');
    expect(avs(28_000, 5_050)).toContain('request.exceeds-offer'); // 140 W / 28 V = 5 A
  });
});

describe('timing.hard-reset-recovery (§7.1.5, tPSHardReset, tSafe0V, tSrcRecover, tSrcTurnOn, tFirstSourceCap)', () => {
  /** A sink's Hard Reset at 1 s with VBUS readings every 50 ms from `profile(tAfterResetUs)`, then offers at `capsAtUs`. */
  function afterReset(profile: (dt: number) => number, capsAtUs: number): (Exchange | TraceRecord)[] {
    const steps: (Exchange | TraceRecord)[] = [...sprContract(), { t: 1_000_000, event: 'hard_reset', from: 'sink' }];
    for (let dt = 0; 1_000_000 + dt < capsAtUs; dt += 50_000) steps.push({ t: 1_000_000 + dt, vbus: { mv: profile(dt) } });
    steps.push(...acked(sprCaps(0), 'source', 0).map((s, i) => (i === 0 ? { ...s, at: capsAtUs } : s)));
    return steps;
  }
  // Off from 30 ms to 300 ms (falling), at 0 V until 1.1 s (tSrcRecover 800 ms), 5 V by 1.2 s.
  const lawful = (dt: number) => (dt < 30_000 ? 20_000 : dt < 300_000 ? Math.max(0, 20_000 - (dt - 30_000) * 0.08) : dt < 1_100_000 ? 0 : 5_000);
  it('is quiet when VBUS follows the specification', () => {
    expect(rulesOf(afterReset(lawful, 2_300_000))).not.toContain('timing.hard-reset-recovery');
  });
  it('VBUS never leaves 20 V', () => {
    expect(analyse(afterReset(() => 20_000, 2_300_000)).findings.find((f) => f.rule === 'timing.hard-reset-recovery')?.message).toMatch(/vSafe0V/);
  });
  it('VBUS back sooner than tSrcRecover', () => {
    const quick = (dt: number) => (dt < 100_000 ? 20_000 : dt < 300_000 ? 0 : 5_000);
    expect(analyse(afterReset(quick, 1_600_000)).findings.find((f) => f.rule === 'timing.hard-reset-recovery')?.message).toMatch(/tSrcRecover/);
  });
  it('first Source_Capabilities later than tFirstSourceCap after vSafe5V', () => {
    expect(analyse(afterReset(lawful, 2_700_000)).findings.find((f) => f.rule === 'timing.hard-reset-recovery')?.message).toMatch(/tFirstSourceCap/);
  });
  it('more Hard Resets than nHardResetCount allows with a silent partner', () => {
    const steps: (Exchange | TraceRecord)[] = [{ t: 0, event: 'attach', cc: 'CC1', rp: '3.0A' }];
    for (let i = 0; i < 4; i++) steps.push({ msg: sprCaps(0), from: 'source', at: 200_000 + i * 2_000_000 }, { t: 900_000 + i * 2_000_000, event: 'hard_reset', from: 'source' });
    expect(rulesOf(steps)).toContain('timing.hard-reset-recovery');
    expect(rulesOf(steps.slice(0, 7))).not.toContain('timing.hard-reset-recovery');
  });
  it('names tSinkWaitCap as the cause when a sink resets a source that never offered', () => {
    const a = analyse([
      { t: 0, event: 'attach', cc: 'CC1', rp: '3.0A' },
      { t: 700_000, event: 'hard_reset', from: 'sink' },
    ]);
    expect(a.hardResets[0]?.cause).toMatch(/tSinkWaitCap/);
  });
});

describe('protocol.collision (§5.7 collision avoidance, SinkTxNG = Rp 1.5 A)', () => {
  const getCaps = (afterRpUs: number, rp: '1.5A' | '3.0A'): (Exchange | TraceRecord)[] => {
    const scene = capture(sprContract());
    const end = scene[scene.length - 1]!.t + 1_000;
    return [...scene, { t: end, event: 'rp', rp }, ...acked(pdHex('Get_Source_Cap', { id: 1, from: 'sink' }), 'sink', 1).map((s, i) => (i === 0 ? { ...s, at: end + afterRpUs } : s))];
  };
  it('is an error when the sink starts 30 ms into SinkTxNG', () => {
    expect(rulesOf(getCaps(30_000, '1.5A'))).toContain('protocol.collision');
  });
  it('is quiet within tSinkTx of the change, or under SinkTxOK', () => {
    expect(rulesOf(getCaps(10_000, '1.5A'))).not.toContain('protocol.collision');
    expect(rulesOf(getCaps(30_000, '3.0A'))).not.toContain('protocol.collision');
  });
});

describe('caps.revision (APDOs are Revision 3.x only, §6.4.1)', () => {
  const offers = [fixedPdo(5_000, 3_000), fixedPdo(9_000, 3_000), ppsApdo(3_300, 11_000, 3_000)];
  it('is an error for PD 2.0 offers with a PPS APDO', () => {
    expect(analyse(acked(sprCaps(0, offers, '2.0'), 'source', 0, 100, '2.0')).findings.filter((f) => f.rule === 'caps.revision')).toMatchObject([{ object: 3 }]);
  });
  it('is quiet for PD 3.0', () => {
    expect(rulesOf(acked(sprCaps(0, offers), 'source', 0))).not.toContain('caps.revision');
  });
});

describe('a new message inside tReceive instead of a retry (§6.7.2, §6.6.1)', () => {
  it('is protocol.missing-goodcrc when the next MessageID follows 0.3 ms after an unacknowledged message', () => {
    const steps: Exchange[] = [
      ...acked(sprCaps(0), 'source', 0),
      ...acked(pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(2, 2_000)] }), 'sink', 0, 3_000),
      { msg: pdHex('Accept', { id: 1, from: 'source' }), from: 'source', gapUs: 2_000 },
      ...acked(pdHex('PS_RDY', { id: 2, from: 'source' }), 'source', 2, 300),
    ];
    expect(analyse(steps).findings.find((f) => f.rule === 'protocol.missing-goodcrc')?.message).toMatch(/next MessageID 2 .* retry the Accept/);
  });
});

describe('request.cable-current (Discover Identity VBUS Current Handling, §6.4.4.3.1)', () => {
  const withCable = (ma: 3_000 | 5_000) => [...cableDiscovery(ma, false, 50_000), ...sprContract(300_000)];
  it('is an error for a 5 A contract over a 3 A cable', () => {
    const five: Exchange[] = [
      ...cableDiscovery(3_000, false, 50_000),
      ...acked(sprCaps(0), 'source', 0).map((s, i) => (i === 0 ? { ...s, at: 300_000 } : s)),
      ...acked(pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(4, 5_000)] }), 'sink', 0, 3_000),
      ...acked(pdHex('Accept', { id: 1, from: 'source' }), 'source', 1, 2_000),
      ...acked(pdHex('PS_RDY', { id: 2, from: 'source' }), 'source', 2, 200_000),
    ];
    expect(analyse(five).findings.filter((f) => f.rule === 'request.cable-current')).toMatchObject([{ severity: 'error', message: expect.stringMatching(/3 A, 50 V passive cable/) }]);
  });
  it('is quiet for a 3 A contract over a 3 A cable', () => {
    expect(rulesOf(withCable(3_000))).not.toContain('request.cable-current');
  });
});
