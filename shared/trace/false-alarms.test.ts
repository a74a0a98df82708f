/**
 * Correct captures, built message by message from the specification, on which the analyser once
 * raised errors. Each case names the section that makes the capture correct.
 */
import { describe, expect, it } from 'vitest';
import { acked, capture, pdHex, pdoWord, type Exchange } from '../../tests/fixtures/traces/spec-build.ts';
import { eprScene, fixedRdo, sprCaps, sprContract } from '../../tests/fixtures/traces/spec-scenes.ts';
import { eprAvsApdo, fixedPdo, paddingPdo } from '../rules/pdo-builders.ts';
import { checkCaps } from '../rules/index.ts';
import { analyseRecords } from './analyser.ts';
import type { TraceRecord } from './records.ts';

const errors = (records: TraceRecord[]) => analyseRecords(records).findings.filter((f) => f.severity === 'error');

describe('false alarms removed (correct captures stay free of errors)', () => {
  // USB PD R3.2 V1.1 §6.7.2 (RetryCounter, nRetryCount = 2) and §6.8.1 / §8.3.3.4 (a transmission
  // error after the last retry makes the policy engine send Soft_Reset): the Soft_Reset is a new
  // message with MessageID 0, not a fourth copy of the message that failed.
  it('a Soft_Reset after the last retry is not a fourth retry', () => {
    const request = pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(2, 2_000)] });
    const records = capture([
      ...acked(sprCaps(0), 'source', 0),
      // The source's receiver saw each copy corrupted (so it sent no GoodCRC); so did the capture.
      { msg: request, from: 'sink', gapUs: 3_000, crcOk: false },
      { msg: request, from: 'sink', gapUs: 1_150, crcOk: false },
      { msg: request, from: 'sink', gapUs: 1_150, crcOk: false },
      ...acked(pdHex('Soft_Reset', { id: 0, from: 'sink' }), 'sink', 0, 1_150),
      ...acked(pdHex('Accept', { id: 0, from: 'source' }), 'source', 0, 2_000),
      ...acked(sprCaps(0), 'source', 0, 5_000),
    ]);
    const found = analyseRecords(records).findings;
    expect(found.map((f) => f.message).join('\n')).not.toMatch(/more retries than nRetryCount/);
    // The receiver rightly sent no GoodCRC for corrupted copies: the CRC findings say what happened.
    expect(found.filter((f) => f.rule === 'protocol.missing-goodcrc')).toEqual([]);
    expect(found.filter((f) => f.rule === 'decode.crc')).toHaveLength(3);
  });

  // §6.8.3 Hard Reset resets the protocol layer of both ports; §8.3.3.2 PE_SRC_Discovery: before a
  // partner answers, the source repeats Source_Capabilities every tTypeCSendSourceCap, nCapsCount times.
  it('a source offering to a silent partner after a Hard Reset gets no missing-GoodCRC errors', () => {
    const steps: (Exchange | TraceRecord)[] = [...sprContract(), { t: 700_000, event: 'hard_reset', from: 'sink' }];
    for (let i = 0; i < 20; i++) steps.push({ msg: sprCaps(0), from: 'source', at: 1_600_000 + i * 150_000 });
    const found = analyseRecords(capture(steps)).findings;
    expect(found.filter((f) => f.rule === 'protocol.missing-goodcrc')).toEqual([]);
  });

  // §6.3.? / §8.3.2.9 Power Role Swap: the ports swap roles and their protocol layers start again,
  // so the new source's first Source_Capabilities may carry MessageID 0 (issue 11; from memory).
  it('MessageIDs that start again at 0 after a PR_Swap are not an error', () => {
    const swap: Exchange[] = [
      ...sprContract(),
      ...acked(pdHex('PR_Swap', { id: 1, from: 'sink' }), 'sink', 1, 50_000),
      ...acked(pdHex('Accept', { id: 3, from: 'source' }), 'source', 3, 2_000),
      ...acked(pdHex('PS_RDY', { id: 4, from: 'source' }), 'source', 4, 300_000),
      // The former sink now sources VBUS and says so in its header (Port Power Role = Source).
      ...acked(pdHex('PS_RDY', { id: 0, from: 'source' }), 'source', 0, 100_000),
      ...acked(pdHex('Source_Capabilities', { id: 1, from: 'source', objects: [pdoWord(fixedPdo(5_000, 3_000))] }), 'source', 1, 30_000),
      ...acked(pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(1, 1_000)] }), 'sink', 0, 3_000),
      ...acked(pdHex('Accept', { id: 2, from: 'source' }), 'source', 2, 2_000),
      ...acked(pdHex('PS_RDY', { id: 3, from: 'source' }), 'source', 3, 20_000),
    ];
    const found = errors(capture(swap));
    expect(found.filter((f) => f.rule === 'protocol.message-id')).toEqual([]);
  });

  // §6.6.4.1 / Time Values: in EPR mode tPSTransition is 830–1020 ms (issue 11), so PS_RDY 900 ms
  // after the Accept of an EPR_Request is on time.
  it('PS_RDY 900 ms after an EPR Accept is within EPR tPSTransition', () => {
    const found = errors(capture(eprScene({ psRdyUs: 900_000 })));
    expect(found).toEqual([]);
  });
  it('PS_RDY 1.1 s after an EPR Accept is still late', () => {
    expect(errors(capture(eprScene({ psRdyUs: 1_100_000 }))).map((f) => f.rule)).toContain('timing.ps-transition');
  });

  // §5.6.2 / §6.7.2: a receiver discards a message with a bad CRC and sends no GoodCRC; the sender
  // retries and the retry delivers it. Nothing was lost, so it is a warning at most.
  it('a CRC error the retry recovered is a warning, not an error', () => {
    const caps = sprCaps(0);
    const records = capture([
      { msg: caps, from: 'source', at: 100_000, crcOk: false },
      ...acked(caps, 'source', 0, 1_150),
      ...acked(pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(2, 2_000)] }), 'sink', 0, 3_000),
    ]);
    const crc = analyseRecords(records).findings.filter((f) => f.rule === 'decode.crc');
    expect(crc).toHaveLength(1);
    expect(crc[0]).toMatchObject({ severity: 'warning' });
    expect(crc[0]!.message).toMatch(/retry/);
  });
  it('a CRC error nobody recovered stays an error', () => {
    const records = capture([...acked(sprCaps(0), 'source', 0), { msg: pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(2, 2_000)] }), from: 'sink', gapUs: 3_000, crcOk: false }]);
    expect(analyseRecords(records).findings.find((f) => f.rule === 'decode.crc')).toMatchObject({ severity: 'error' });
  });

  // §10.2.1 Power Rules / Table 10-x: a 7.5 W source at 5 V 1.5 A has PDP 7 W (the PDP is whole
  // watts; a source does not claim more than it offers), not 8 W, which would need 1.6 A at 5 V.
  it('PDP inference does not round 5 V 1.5 A up to 8 W', () => {
    const report = checkCaps([fixedPdo(5_000, 1_500)]);
    expect(report.pdpW).toBe(7);
    expect(report.findings.filter((f) => f.severity === 'error')).toEqual([]);
  });

  // USB PD R3.2 V1.1 §6.4.10 / §8.3.3.26 EPR entry needs an EPR-capable 50 V 5 A cable (Type-C R2.3
  // §4.9, e-marker EPR Mode Capable): over a 3 A cable there is no EPR mode, not a 3 A EPR contract.
  it('an EPR 28 V 5 A offer over a 3 A cable is caps.cable-epr, not "at most 3 A (84 W)"', () => {
    const epr = [
      fixedPdo(5_000, 3_000, { eprModeCapable: true }),
      fixedPdo(9_000, 3_000),
      fixedPdo(15_000, 3_000),
      fixedPdo(20_000, 5_000),
      paddingPdo(),
      paddingPdo(),
      paddingPdo(),
      fixedPdo(28_000, 5_000),
      eprAvsApdo(15_000, 28_000, 140),
    ];
    const findings = checkCaps(epr, { epr: true, cableMa: 3_000, pdpW: 140 }).findings;
    expect(findings.map((f) => f.message).join('\n')).not.toMatch(/84 W/);
    const cable = findings.filter((f) => f.rule === 'caps.cable-epr');
    expect(cable.length).toBeGreaterThan(0);
    expect(cable[0]).toMatchObject({ severity: 'info' });
    expect(cable[0]!.message).toMatch(/EPR/);
    // The SPR 20 V 5 A offer is still a 5 A-cable matter.
    expect(findings.filter((f) => f.rule === 'caps.cable-current').map((f) => f.object)).toEqual([4]);
  });
});

describe('the summary sentence reads one way', () => {
  // §8.3.3.3 PE_SNK_Transition_Sink: the sink's PSTransitionTimer runs out without PS_RDY → Hard Reset.
  it('an accepted Request with no PS_RDY is not "no Request was accepted"', () => {
    const records = capture([
      ...acked(sprCaps(0), 'source', 0),
      ...acked(pdHex('Request', { id: 0, from: 'sink', objects: [fixedRdo(2, 2_000)] }), 'sink', 0, 3_000),
      ...acked(pdHex('Accept', { id: 1, from: 'source' }), 'source', 1, 2_000),
      { t: 700_000, event: 'hard_reset', from: 'sink' },
    ]);
    const { summary } = analyseRecords(records);
    expect(summary).not.toMatch(/no Request was accepted/);
    expect(summary).toBe(
      'No contract: the source accepted a Request but never completed it with PS_RDY; Hard Reset at 0.7 s; 1 error; likely cause of the Hard Reset: the source accepted the Request at 0.005 s but sent no PS_RDY within tPSTransition, which points at the adapter (source).',
    );
  });
});
