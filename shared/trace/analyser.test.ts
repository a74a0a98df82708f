import fc from 'fast-check';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HEX, negotiation, sequence } from '../../tests/fixtures/traces/build.ts';
import { encodeMessage, parseHex, toHex } from '../pd/index.ts';
import { fixedPdo, variablePdo } from '../rules/pdo-builders.ts';
import { encodeWaveform, type WirePacket } from '../wire/index.ts';
import { analyseRecords, createAnalyser } from './analyser.ts';
import type { TraceRecord } from './records.ts';
import { analyseTrace } from './session.ts';

const FIXTURES = join(import.meta.dirname, '../../tests/fixtures/traces');
const rules = (records: TraceRecord[]) => analyseRecords(records).findings.map((f) => f.rule);

interface Expectation {
  include: string[];
  exclude: string[];
  contracts?: Record<string, unknown>[];
}

// Each fixture names in its header the rules it must fire and those that must stay quiet, with the
// specification reference of the limit it crosses (e.g. tSenderResponse, USB PD R3.2 V1.1 §6.6).
describe('trace fixtures', () => {
  const files = readdirSync(FIXTURES).filter((f) => f.endsWith('.trace.jsonl'));
  it('has a fixture for every trace rule', () => {
    expect(files.length).toBeGreaterThanOrEqual(18);
  });
  for (const file of files) {
    it(file, () => {
      const text = readFileSync(join(FIXTURES, file), 'utf8');
      const header = JSON.parse(text.slice(0, text.indexOf('\n'))) as { expect: Expectation; ref: string };
      const result = analyseTrace(text);
      expect(result.ok).toBe(true);
      if (!result.ok) return;
      const { findings, contracts } = result.analysis;
      const fired = findings.map((f) => f.rule);
      for (const rule of header.expect.include) expect(fired, `${file} must report ${rule}`).toContain(rule);
      for (const rule of header.expect.exclude) {
        if (rule.startsWith('*'))
          expect(
            findings.filter((f) => f.severity === rule.slice(1)),
            `${file}: no ${rule.slice(1)}`,
          ).toEqual([]);
        else expect(fired).not.toContain(rule);
      }
      for (const [i, c] of (header.expect.contracts ?? []).entries()) expect(contracts[i]).toMatchObject(c);
      for (const f of findings) {
        expect(f.ref.length).toBeGreaterThan(0);
        expect(f.message).toMatch(/^[A-Z].*\.$/);
      }
    });
  }
});

describe('one negotiation in three formats', () => {
  it('gives the same contracts from JSON Lines, plain text and VCD', () => {
    const jsonl = readFileSync(join(FIXTURES, 'clean.trace.jsonl'), 'utf8');
    const text = readFileSync(join(FIXTURES, 'clean.txt'), 'utf8');
    const packets: WirePacket[] = [];
    for (const line of jsonl.split('\n').slice(1)) {
      if (!line.includes('"msg"')) continue;
      const parsed = parseHex((JSON.parse(line) as { msg: string }).msg);
      if (parsed.ok) packets.push({ sop: 'SOP', bytes: parsed.bytes });
    }
    const { vcd } = encodeWaveform(packets);
    const results = [analyseTrace(jsonl), analyseTrace(text), analyseTrace(vcd)];
    const formats = results.map((r) => (r.ok ? r.analysis.format : r.error.code));
    expect(formats).toEqual(['jsonl', 'text', 'vcd']);
    const shapes = results.map((r) => (r.ok ? r.analysis.contracts.map(({ t: _t, ...c }) => c) : []));
    // Object 2 of the offers is 9 V 3 A; the Request asks 2 A of it (USB PD R3.2 V1.1 §6.4.1.2.2, §6.4.2).
    expect(shapes[0]).toEqual([{ kind: 'fixed', objectPosition: 2, voltageMv: 9_000, currentMa: 2_000, powerMw: 18_000 }]);
    expect(shapes[1]).toEqual(shapes[0]);
    expect(shapes[2]).toEqual(shapes[0]);
    for (const r of results) if (r.ok) expect(r.analysis.counts.error).toBe(0);
  });
});

describe('wire durations', () => {
  // The wire writer leaves 500 µs idle between packets (its default gapUs); the decoder's preamble
  // starts minus our computed durations (USB PD R3.2 V1.1 §5.6 bit counts) must give back that gap.
  it('agree with the wire encoder of clean.vcd', () => {
    const result = analyseTrace(readFileSync(join(FIXTURES, 'clean.vcd'), 'utf8'));
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const messages = result.analysis.timeline.messages;
    expect(messages).toHaveLength(8);
    for (let i = 1; i < messages.length; i++) {
      const idleUs = messages[i]!.t - messages[i - 1]!.t - messages[i - 1]!.durationUs;
      expect(Math.abs(idleUs - 500)).toBeLessThanOrEqual(5);
    }
  });
});

describe('timers by revision', () => {
  // tSenderResponse runs from the end of the GoodCRC to the end of the response (USB PD R3.2 V1.1
  // §6.6.2, from memory); a Request takes 630 µs on the wire (§5.6), so a gap g gives g + 630 µs.
  // Limits: 33 ms in R3.x (USB PD R3.2 V1.1 §6.6 Time Values), 30 ms in R2.0 (USB PD R2.0 V1.3 §6.6).
  it('allows 32 ms and flags 34 ms in R3.x', () => {
    expect(rules(negotiation({ request: 31_370 }).records)).not.toContain('timing.sender-response');
    expect(rules(negotiation({ request: 33_370 }).records)).toContain('timing.sender-response');
  });
  it('flags 31 ms in R2.0 but not in R3.x', () => {
    expect(rules(negotiation({ request: 30_370, r20: true }).records)).toContain('timing.sender-response');
    expect(rules(negotiation({ request: 30_370 }).records)).not.toContain('timing.sender-response');
  });
  it('checks Accept after Request with the same limit', () => {
    expect(rules(negotiation({ accept: 40_000 }).records)).toContain('timing.sender-response');
  });
  // tPSTransition 450–550 ms (USB PD R3.2 V1.1 §6.6), from the Accept's GoodCRC to the end of PS_RDY
  // (497 µs on the wire).
  it('allows PS_RDY 540 ms after Accept and flags 560 ms', () => {
    expect(rules(negotiation({ psRdy: 539_503 }).records)).not.toContain('timing.ps-transition');
    const late = analyseRecords(negotiation({ psRdy: 559_503 }).records).findings.find((f) => f.rule === 'timing.ps-transition');
    expect(late?.message).toContain('560 ms');
  });
  // nRetryCount: 2 in R3.x, 3 in R2.0 (USB PD R3.2 V1.1 §6.7 Counter Values; R2.0 V1.3 §6.7).
  it('counts retries against nRetryCount of the revision', () => {
    const retried = (r20: boolean, copies: number) => {
      const caps = r20 ? HEX.caps20 : HEX.caps;
      const request = r20 ? HEX.request20 : HEX.request9v2a;
      const steps = [
        { msg: caps, from: 'source' as const, gapUs: 0 },
        { msg: r20 ? HEX.sinkGoodCrc20(0) : HEX.sinkGoodCrc(0), from: 'sink' as const, gapUs: 70 },
        ...Array.from({ length: copies }, (_, i) => ({ msg: request, from: 'sink' as const, gapUs: i === 0 ? 5_000 : 1_200 })),
        { msg: r20 ? HEX.sourceGoodCrc20(0) : HEX.sourceGoodCrc(0), from: 'source' as const, gapUs: 70 },
      ];
      return rules(sequence(150_000, steps).records);
    };
    expect(retried(false, 3)).not.toContain('protocol.missing-goodcrc');
    expect(retried(false, 4)).toContain('protocol.missing-goodcrc');
    expect(retried(true, 4)).not.toContain('protocol.missing-goodcrc');
    expect(retried(true, 5)).toContain('protocol.missing-goodcrc');
  });
  // tReceive 0.9–1.1 ms (USB PD R3.2 V1.1 §6.6): the GoodCRC (497 µs) must end within 1.1 ms of the message.
  it('flags a GoodCRC that ends later than tReceive', () => {
    const late = sequence(150_000, [
      { msg: HEX.caps, from: 'source', gapUs: 0 },
      { msg: HEX.sinkGoodCrc(0), from: 'sink', gapUs: 700 },
    ]);
    expect(rules(late.records)).toContain('protocol.missing-goodcrc');
    const onTime = sequence(150_000, [
      { msg: HEX.caps, from: 'source', gapUs: 0 },
      { msg: HEX.sinkGoodCrc(0), from: 'sink', gapUs: 150 },
    ]);
    expect(rules(onTime.records)).not.toContain('protocol.missing-goodcrc');
  });
});

describe('analysis', () => {
  it('heads the analysis with a summary sentence', () => {
    const result = analyseTrace(readFileSync(join(FIXTURES, 'timing-pps-keepalive.trace.jsonl'), 'utf8'));
    expect(result.ok && result.analysis.summary).toBe(
      'Contract PPS 8.4 V 2.5 A at 0.361 s; Hard Reset at 13.5 s; 1 error; likely cause of the Hard Reset: the sink stopped re-requesting its programmable contract, which points at the device (sink).',
    );
  });
  it('names the earliest error in the summary when no Hard Reset explains it', () => {
    const result = analyseTrace(readFileSync(join(FIXTURES, 'vbus-out-of-range.trace.jsonl'), 'utf8'));
    expect(result.ok && result.analysis.summary).toBe("Contract 9 V 2 A at 0.361 s; 1 error; likely cause: VBUS outside the contract's tolerance at 0.5 s, which points at the adapter (source).");
  });
  it('builds a timeline with wire durations and acknowledgements', () => {
    const { timeline } = analyseRecords(negotiation().records);
    const [caps, goodCrc] = timeline.messages;
    // 18 bytes: 64 + 20 + 180 + 40 + 5 = 309 bits at 300 kbps = 1030 µs (USB PD R3.2 V1.1 §5.6).
    expect(caps).toMatchObject({ t: 150_000, durationUs: 1_030, from: 'source', sop: 'SOP', messageType: 'Source_Capabilities', messageId: 0, hex: HEX.caps });
    expect(goodCrc).toMatchObject({ messageType: 'GoodCRC', from: 'sink', goodCrcFor: 0 });
    expect(timeline.contracts).toMatchObject([{ contract: { voltageMv: 9_000 } }]);
  });
  it('keeps on each timeline contract the VBUS range its readings are checked against, the band the pages draw', () => {
    // Fixed 9 V: ±5 % (USB PD R3.2 V1.1 §7.1, vSrcNew; from memory, as shared/trace/vbus.ts).
    expect(analyseRecords(negotiation().records).timeline.contracts[0]!.vbus).toEqual({ minMv: 8_550, maxMv: 9_450 });
    // Programmable 8.4 V: the requested voltage ±5 % (§7.1, vPpsNew; from memory).
    const pps = analyseTrace(readFileSync(join(FIXTURES, 'timing-pps-keepalive.trace.jsonl'), 'utf8'));
    expect(pps.ok && pps.analysis.timeline.contracts[0]!.vbus).toEqual({ minMv: 7_980, maxMv: 8_820 });
    // A variable supply: the offer's own minimum and maximum (§6.4.1.2.3; from memory), which the
    // pages drew no band for while they kept their own copy of the limits.
    const hexOf = (input: Parameters<typeof encodeMessage>[0]) => {
      const encoded = encodeMessage(input);
      if (!encoded.ok) throw new Error(encoded.error.message);
      return toHex(encoded.bytes);
    };
    const header = (messageType: string, messageId: number, from: 'source' | 'sink') =>
      ({ messageType, messageId, powerRole: from, dataRole: from === 'source' ? 'dfp' : 'ufp', specRevision: '3.0', extended: false }) as const;
    const flags = { capabilityMismatch: false, usbCommunicationsCapable: false, noUsbSuspend: true, unchunkedExtendedMessages: false, eprModeCapable: false, giveBack: false };
    const variable = sequence(150_000, [
      { msg: hexOf({ header: header('Source_Capabilities', 0, 'source'), objects: [fixedPdo(5_000, 3_000), variablePdo(9_000, 12_000, 2_000)] } as never), from: 'source', gapUs: 0 },
      { msg: HEX.sinkGoodCrc(0), from: 'sink', gapUs: 70 },
      {
        msg: hexOf({ header: header('Request', 0, 'sink'), objects: [{ kind: 'rdo-variable', objectPosition: 2, operatingCurrentMa: 1_500, maxOperatingCurrentMa: 1_500, ...flags }] } as never),
        from: 'sink',
        gapUs: 5_000,
      },
      { msg: HEX.sourceGoodCrc(0), from: 'source', gapUs: 70 },
      { msg: HEX.accept(1), from: 'source', gapUs: 2_200 },
      { msg: HEX.sinkGoodCrc(1), from: 'sink', gapUs: 63 },
      { msg: HEX.psRdy(2), from: 'source', gapUs: 200_000 },
      { msg: HEX.sinkGoodCrc(2), from: 'sink', gapUs: 63 },
    ]);
    const analysed = analyseRecords(variable.records);
    expect(analysed.timeline.contracts).toMatchObject([{ contract: { kind: 'variable' }, vbus: { minMv: 9_000, maxMv: 12_000 } }]);
  });
  it('takes the direction from the header when a record has none', () => {
    const records = negotiation().records.map((r) => ('msg' in r ? { t: r.t, msg: r.msg } : r));
    const analysis = analyseRecords(records);
    expect(analysis.timeline.messages.map((m) => m.from).slice(0, 3)).toEqual(['source', 'sink', 'sink']);
    expect(analysis.contracts).toHaveLength(1);
  });
  it('keeps the timeline and the findings bounded', () => {
    const analyser = createAnalyser({ timelineLimit: 10, findingsLimit: 5 });
    for (let i = 0; i < 1_000; i++) analyser.push({ t: i * 1_000, vbus: { mv: 5_000 } });
    for (let i = 0; i < 50; i++) analyser.malformed(i + 1, 'not valid JSON');
    const analysis = analyser.finish();
    expect(analysis.timeline.measurements.length).toBeLessThanOrEqual(10);
    expect(analysis.timeline.measurements.length + analysis.timeline.omitted.measurements).toBe(1_000);
    const ts = analysis.timeline.measurements.map((m) => m.t);
    expect(ts[ts.length - 1]).toBeGreaterThan(500_000);
    expect(analysis.findings).toHaveLength(5);
    expect(analysis.counts.warning).toBe(50);
    expect(analysis.findingsOmitted).toBe(45);
  });
  it('hands every message to onMessage with its index in the whole trace, past the timeline it keeps', () => {
    const heard: { index: number; messageType: string; goodCrcFor?: number }[] = [];
    const analysis = analyseRecords(negotiation().records, {
      timelineLimit: 3,
      onMessage: (m, index) => heard.push({ index, messageType: m.messageType, ...(m.goodCrcFor === undefined ? {} : { goodCrcFor: m.goodCrcFor }) }),
    });
    expect(analysis.timeline.messages).toHaveLength(3);
    expect(analysis.timeline.omitted.messages).toBe(5);
    expect(heard).toEqual([
      { index: 0, messageType: 'Source_Capabilities' },
      { index: 1, messageType: 'GoodCRC', goodCrcFor: 0 },
      { index: 2, messageType: 'Request' },
      { index: 3, messageType: 'GoodCRC', goodCrcFor: 2 },
      { index: 4, messageType: 'Accept' },
      // A GoodCRC past the kept timeline still names the message it acknowledges.
      { index: 5, messageType: 'GoodCRC', goodCrcFor: 4 },
      { index: 6, messageType: 'PS_RDY' },
      { index: 7, messageType: 'GoodCRC', goodCrcFor: 6 },
    ]);
  });
  it('reports an empty trace as an input error', () => {
    const result = analyseTrace('not a trace\n');
    expect(result).toMatchObject({ ok: false, error: { code: 'trace.empty' } });
    expect(analyseTrace('')).toMatchObject({ ok: false, error: { code: 'trace.empty' } });
  });
});

describe('repeated offers', () => {
  // Source_Capabilities header, R3.0, from the source as DFP: type 1, bit 5 DFP, bits 7..6 = 10b, bit 8 Source,
  // MessageID in bits 11..9, Number of Data Objects in bits 14..12 (USB PD R3.2 V1.1 §6.2.1.1, Table 6.1).
  const capsHex = (id: number, objects: string[]) => {
    const header = 0x01a1 | (id << 9) | (objects.length << 12);
    return (header & 0xff).toString(16).padStart(2, '0') + (header >> 8).toString(16).padStart(2, '0') + objects.join('');
  };
  // The four objects of HEX.caps: 5 V, 9 V, 15 V 3 A fixed and PPS 3.3–11 V 3 A (§6.4.1, Tables 6.9 and 6.14).
  const objects = ['2c910100', '2cd10200', '2cb10400', '3c21dcc0'];
  // An unanswered source repeats its offers every tTypeCSendSourceCap, 100–200 ms (USB PD R3.2 V1.1 §6.6, Table 6.68, from memory).
  const repeated = (lists: string[][]) =>
    sequence(
      150_000,
      lists.map((list, i) => ({ msg: capsHex(i % 8, list), from: 'source' as const, gapUs: i === 0 ? 0 : 150_000 })),
    ).records;
  const count = (records: TraceRecord[], rule: string) => analyseRecords(records).findings.filter((f) => f.rule === rule).length;

  it('checks five copies that differ only in MessageID once', () => {
    const records = repeated([objects, objects, objects, objects, objects]);
    expect(records[0]).toMatchObject({ msg: HEX.caps });
    expect(new Set(records.map((r) => ('msg' in r ? r.msg : ''))).size).toBe(5);
    expect(count(records, 'caps.pdp-inferred')).toBe(1);
  });
  it('checks the offers again when the list of objects changes', () => {
    const records = repeated([objects, objects, objects, objects.slice(0, 3), objects.slice(0, 3)]);
    expect(count(records, 'caps.pdp-inferred')).toBe(2);
  });
});

describe('robustness', () => {
  const noInternalFault = (result: ReturnType<typeof analyseTrace>) => {
    if (!result.ok) expect(result.error.code).not.toBe('trace.internal');
  };
  it('never fails inside on random text in any format', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 400 }), fc.constantFrom('auto', 'jsonl', 'text', 'vcd'), (text, format) => {
        noInternalFault(analyseTrace(text, { format }));
      }),
      { numRuns: 300 },
    );
  });
  it('never fails inside on VCD-like noise', () => {
    const token = fc.constantFrom(
      '$timescale 1 ns $end',
      '$timescale 10us $end',
      '$var wire 1 ! cc $end',
      '$var wire 4 # bus $end',
      '$enddefinitions $end',
      '$dumpvars',
      '$end',
      '0!',
      '1!',
      'x!',
      'b101 #',
    );
    const time = fc.nat(5_000_000).map((n) => `#${n}`);
    fc.assert(
      fc.property(fc.array(fc.oneof(token, time, fc.string({ maxLength: 8 })), { maxLength: 200 }), (tokens) => {
        noInternalFault(analyseTrace(tokens.join('\n'), { format: 'vcd' }));
      }),
      { numRuns: 200 },
    );
  });
  it('never fails inside on random lines of half-valid records', () => {
    const line = fc.oneof(
      fc.string(),
      fc
        .record({ t: fc.integer({ min: -10, max: 2_000_000 }), msg: fc.constantFrom(HEX.caps, HEX.request9v2a, '8100', 'a101', 'a303', 'a605', '8102', '8d00', 'ff', '1f00') })
        .map((r) => JSON.stringify(r)),
      fc.record({ t: fc.nat(2_000_000), event: fc.constantFrom('attach', 'detach', 'hard_reset', 'cable_reset') }).map((r) => JSON.stringify(r)),
      fc.record({ t: fc.nat(2_000_000), vbus: fc.record({ mv: fc.nat(25_000), ma: fc.nat(6_000) }) }).map((r) => JSON.stringify(r)),
      fc.uint8Array({ maxLength: 30 }).map((b) => JSON.stringify({ t: 1, msg: [...b].map((x) => x.toString(16).padStart(2, '0')).join('') || '00' })),
    );
    fc.assert(
      fc.property(fc.array(line, { maxLength: 60 }), (lines) => {
        noInternalFault(analyseTrace(lines.join('\n')));
        noInternalFault(analyseTrace(lines.join('\n'), { format: 'text' }));
      }),
      { numRuns: 300 },
    );
  });
  it('never throws on random message bytes pushed straight into the analyser', () => {
    const hex = fc.uint8Array({ minLength: 2, maxLength: 40 }).map((b) => [...b].map((x) => x.toString(16).padStart(2, '0')).join(''));
    const record = fc.oneof(
      fc.record({ t: fc.nat(3_000_000), msg: hex, from: fc.constantFrom('source' as const, 'sink' as const, 'cable' as const), crcOk: fc.boolean() }),
      fc.record({ t: fc.nat(3_000_000), event: fc.constantFrom('attach' as const, 'detach' as const, 'hard_reset' as const) }),
      fc.record({ t: fc.nat(3_000_000), vbus: fc.record({ mv: fc.nat(25_000), ma: fc.nat(6_000) }) }),
    );
    fc.assert(
      fc.property(fc.array(record, { maxLength: 80 }), (records) => {
        analyseRecords([...negotiation().records, ...records]);
      }),
      { numRuns: 300 },
    );
  });
});
