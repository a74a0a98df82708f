import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { timersPd3 } from '../core/timers.ts';
import { HEX, sequence, type Step } from '../../tests/fixtures/traces/build.ts';
import { analyseRecords } from './analyser.ts';
import type { TraceRecord } from './records.ts';
import { messageDurationUs } from './wire-time.ts';

// Limits (USB PD R3.2 V1.1 §6.6, Time Values table; shared/core/timers.ts): tSenderResponse 27–33 ms,
// tPSTransition 450–550 ms, tPPSRequest 10 s max. A timer runs from the end of the GoodCRC that
// acknowledged the message (§6.6.2 SenderResponseTimer, §6.6.5 PSTransitionTimer; from memory).
// The waiting side's timer may run out anywhere in the range, and its policy engine then sends a
// Hard Reset (§8.3.3.2 PE_SRC_Send_Capabilities, §8.3.3.3 PE_SNK_Select_Capability and
// PE_SNK_Transition_Sink; from memory).

const finding = (records: TraceRecord[], rule: string) => analyseRecords(records).findings.find((f) => f.rule === rule);
const rulesOf = (records: TraceRecord[]) => analyseRecords(records).findings.map((f) => f.rule);

const upToRequest: Step[] = [
  { msg: HEX.caps, from: 'source', gapUs: 0 },
  { msg: HEX.sinkGoodCrc(0), from: 'sink', gapUs: 70 },
  { msg: HEX.request9v2a, from: 'sink', gapUs: 5_000 },
  { msg: HEX.sourceGoodCrc(0), from: 'source', gapUs: 70 },
];
/** Caps, GoodCRC, the sink's Request at 156 597 µs and the source's GoodCRC, which ends at 157 794 µs. */
const requested = sequence(150_000, upToRequest);
const REQUEST_ACK_END = requested.endUs;
const afterRequest = (extra: TraceRecord[]) => [...requested.records, ...extra];

/** The same, answered with Accept (and its GoodCRC): the sink now waits for PS_RDY. */
const accepted = sequence(150_000, [...upToRequest, { msg: HEX.accept(1), from: 'source', gapUs: 2_200 }, { msg: HEX.sinkGoodCrc(1), from: 'sink', gapUs: 63 }]);
const ACCEPT_ACK_END = accepted.endUs;
const afterAccept = (extra: TraceRecord[]) => [...accepted.records, ...extra];

describe('a Request that gets no answer (timing.sender-response)', () => {
  it('is reported when the sink gives up with a Hard Reset after the 33 ms maximum', () => {
    expect(REQUEST_ACK_END).toBe(157_794);
    const records = afterRequest([{ t: REQUEST_ACK_END + 33_400, event: 'hard_reset', from: 'sink' }]);
    const f = finding(records, 'timing.sender-response');
    expect(f?.message).toBe("The source did not answer the sink's Request at 0.157 s within tSenderResponse (33 ms); the sink sent a Hard Reset 33.4 ms after the Request was acknowledged.");
    expect(f?.ref).toBe(timersPd3.tSenderResponse.ref);
    expect(f?.severity).toBe('error');
    const reset = finding(records, 'protocol.hard-reset');
    expect(reset?.message).toBe("The sink sent a Hard Reset at 0.191 s, after the source did not answer the sink's Request at 0.157 s within tSenderResponse.");
    const rules = rulesOf(records);
    expect(rules.indexOf('timing.sender-response')).toBeLessThan(rules.indexOf('protocol.hard-reset'));
  });

  it('is reported when the sink gives up inside the 27–33 ms range, as its timer may', () => {
    const f = finding(afterRequest([{ t: REQUEST_ACK_END + 31_500, event: 'hard_reset', from: 'sink' }]), 'timing.sender-response');
    expect(f?.message).toBe(
      "The source did not answer the sink's Request at 0.157 s before the sink's tSenderResponse timer ran out (27–33 ms); the sink sent a Hard Reset 31.5 ms after the Request was acknowledged.",
    );
    expect(f?.t).toBe(REQUEST_ACK_END + 31_500);
  });

  it('is reported when the sink gives up with Soft_Reset (header 0x028D: Soft_Reset, MessageID 1)', () => {
    const f = finding(afterRequest([{ t: REQUEST_ACK_END + 30_000, msg: '8d02', from: 'sink' }]), 'timing.sender-response');
    expect(f?.message).toContain('the sink sent Soft_Reset 30 ms after the Request was acknowledged.');
  });

  it('is reported when the sink moves on with another message after the maximum', () => {
    // A second Request, MessageID 1 (header 0x1282), 40 ms after the first one's GoodCRC.
    const f = finding(afterRequest([{ t: REQUEST_ACK_END + 40_000, msg: '8212c8200320', from: 'sink' }]), 'timing.sender-response');
    expect(f?.message).toBe("The source did not answer the sink's Request at 0.157 s within tSenderResponse (33 ms); the sink sent Request 40 ms after the Request was acknowledged.");
  });

  it('is reported when the trace ends long enough after the Request', () => {
    const f = finding(afterRequest([{ t: REQUEST_ACK_END + 120_000, vbus: { mv: 5_010 } }]), 'timing.sender-response');
    expect(f?.message).toBe("The source did not answer the sink's Request at 0.157 s within tSenderResponse (33 ms); the trace ends 120 ms after the Request was acknowledged with no answer.");
    expect(f?.t).toBe(REQUEST_ACK_END + 33_000);
  });

  it('stays quiet for an Accept that ends 32 ms after the GoodCRC', () => {
    const acceptUs = REQUEST_ACK_END + 32_000 - messageDurationUs(2);
    const records = afterRequest([
      { t: acceptUs, msg: HEX.accept(1), from: 'source' },
      { t: acceptUs + 560, msg: HEX.sinkGoodCrc(1), from: 'sink' },
    ]);
    expect(rulesOf(records)).not.toContain('timing.sender-response');
  });

  it('stays quiet when the trace simply ends 5 ms after the Request', () => {
    expect(rulesOf(afterRequest([{ t: 156_597 + 5_000, vbus: { mv: 5_010 } }]))).not.toContain('timing.sender-response');
  });

  it('stays quiet when the sink resets before its timer could have run out (20 ms)', () => {
    const records = afterRequest([{ t: REQUEST_ACK_END + 20_000, event: 'hard_reset', from: 'sink' }]);
    expect(rulesOf(records)).not.toContain('timing.sender-response');
    expect(finding(records, 'protocol.hard-reset')?.message).toContain('no cause was found');
  });

  it('stays quiet when the source, not the waiting sink, resets inside the range', () => {
    expect(rulesOf(afterRequest([{ t: REQUEST_ACK_END + 30_000, event: 'hard_reset', from: 'source' }]))).not.toContain('timing.sender-response');
  });

  it('times a log without any GoodCRC from the end of the Request', () => {
    const records = requested.records.filter((r) => !('msg' in r) || (r.msg !== HEX.sinkGoodCrc(0) && r.msg !== HEX.sourceGoodCrc(0)));
    const requestEndUs = 156_597 + messageDurationUs(6);
    const f = finding([...records, { t: requestEndUs + 34_000, event: 'hard_reset', from: 'sink' }], 'timing.sender-response');
    expect(f?.message).toContain('the sink sent a Hard Reset 34 ms after the Request ended.');
  });

  it('leaves an unacknowledged Request to protocol.missing-goodcrc when the trace shows GoodCRCs', () => {
    const records = requested.records.filter((r) => !('msg' in r) || r.msg !== HEX.sourceGoodCrc(0));
    const rules = rulesOf([...records, { t: 200_000, event: 'hard_reset', from: 'sink' }]);
    expect(rules).not.toContain('timing.sender-response');
    expect(rules).toContain('protocol.missing-goodcrc');
  });
});

describe('Source_Capabilities that get no Request (timing.sender-response)', () => {
  const offered = sequence(150_000, upToRequest.slice(0, 2));
  it('is reported when the source gives up with a Hard Reset inside the range', () => {
    const f = finding([...offered.records, { t: offered.endUs + 30_000, event: 'hard_reset', from: 'source' }], 'timing.sender-response');
    expect(f?.message).toBe(
      "The sink did not answer the source's Source_Capabilities at 0.15 s with a Request before the source's tSenderResponse timer ran out (27–33 ms); the source sent a Hard Reset 30 ms after the Source_Capabilities was acknowledged.",
    );
  });
  it('stays quiet for unacknowledged offers repeated every 150 ms (no sink listening yet)', () => {
    const records: TraceRecord[] = [0, 150_000, 300_000].map((dt) => ({ t: 150_000 + dt, msg: HEX.caps, from: 'source' as const }));
    expect(rulesOf(records)).not.toContain('timing.sender-response');
  });
});

describe('an Accept that is never followed by PS_RDY (timing.ps-transition)', () => {
  it('is reported when the trace goes on past the 550 ms maximum', () => {
    const f = finding(afterAccept([{ t: ACCEPT_ACK_END + 600_000, vbus: { mv: 5_020 } }]), 'timing.ps-transition');
    expect(f?.message).toBe('The source accepted the Request at 0.157 s but sent no PS_RDY within tPSTransition (550 ms); the trace ends 600 ms after the Accept was acknowledged with no PS_RDY.');
    expect(f?.ref).toBe(timersPd3.tPSTransition.ref);
  });
  it('is reported when the sink gives up with a Hard Reset inside the 450–550 ms range', () => {
    const records = afterAccept([{ t: ACCEPT_ACK_END + 500_000, event: 'hard_reset', from: 'sink' }]);
    expect(finding(records, 'timing.ps-transition')?.message).toBe(
      "The source accepted the Request at 0.157 s but sent no PS_RDY before the sink's tPSTransition timer ran out (450–550 ms); the sink sent a Hard Reset 500 ms after the Accept was acknowledged.",
    );
    expect(finding(records, 'protocol.hard-reset')?.message).toContain('after the source accepted the Request at 0.157 s but sent no PS_RDY within tPSTransition.');
    expect(rulesOf(records)).not.toContain('timing.sender-response');
  });
  it('stays quiet when the trace ends 100 ms after the Accept, or the sink resets after 300 ms', () => {
    expect(rulesOf(afterAccept([{ t: ACCEPT_ACK_END + 100_000, vbus: { mv: 5_020 } }]))).not.toContain('timing.ps-transition');
    expect(rulesOf(afterAccept([{ t: ACCEPT_ACK_END + 300_000, event: 'hard_reset', from: 'sink' }]))).not.toContain('timing.ps-transition');
  });
});

describe('a programmable contract whose keep-alive stops (timing.pps-keepalive)', () => {
  // The fixture's PPS 8.4 V 2.5 A contract with one keep-alive Request at 1.0 s, without its reset.
  const text = readFileSync(join(import.meta.dirname, '../../tests/fixtures/traces/timing-pps-keepalive.trace.jsonl'), 'utf8');
  const held = text
    .trim()
    .split('\n')
    .slice(1)
    .map((line) => JSON.parse(line) as TraceRecord)
    .filter((r) => !('event' in r && r.event === 'hard_reset'));
  const lastRequestUs = 1_000_000;

  it('is reported when the trace goes on past tPPSRequest with no new Request', () => {
    const f = finding([...held, { t: lastRequestUs + 10_200_000, vbus: { mv: 8_410, ma: 2_400 } }], 'timing.pps-keepalive');
    expect(f?.message).toBe(
      'The sink sent no new Request within tPPSRequest (10 s) of the one at 1 s while its programmable contract (PPS 8.4 V 2.5 A) held; the trace ends 10.2 s later with no new Request.',
    );
    expect(f?.t).toBe(lastRequestUs + timersPd3.tPPSRequest.maxUs);
  });
  it("is finished by the source's Hard Reset after tPPSTimeout", () => {
    const f = finding([...held, { t: 13_500_000, event: 'hard_reset', from: 'source' }], 'timing.pps-keepalive');
    expect(f?.message).toContain('held; the source sent a Hard Reset 12.5 s later.');
  });
  it('stays quiet while the trace ends within tPPSRequest, or a new Request comes in time', () => {
    expect(rulesOf([...held, { t: lastRequestUs + 9_900_000, vbus: { mv: 8_410 } }])).not.toContain('timing.pps-keepalive');
    const kept: TraceRecord[] = [
      { t: 10_500_000, msg: '821432480340', from: 'sink' },
      { t: 10_500_700, msg: 'a105', from: 'source' },
      { t: 12_000_000, vbus: { mv: 8_410 } },
    ];
    expect(rulesOf([...held, ...kept])).not.toContain('timing.pps-keepalive');
  });
});
