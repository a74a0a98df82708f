import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { traceHeaderSchema, traceRecordSchema } from './record-schema.ts';
import { checkRecord } from './records.ts';

// Record shapes of docs/trace.md ("JSON Lines" table).
describe('checkRecord', () => {
  it('reads each record kind and keeps unknown fields', () => {
    const message = { t: 152_000, msg: 'a1612c91', from: 'source', probe: 'bench 2' };
    const checked = checkRecord(message);
    expect(checked).toEqual({ kind: 'record', record: message });
    expect(checkRecord({ t: 0, event: 'attach', cc: 'CC1', rp: '3.0A' }).kind).toBe('record');
    expect(checkRecord({ t: 181_000, vbus: { mv: 5_030, ma: 410 } }).kind).toBe('record');
    expect(checkRecord({ t: 5, note: 'probe moved' }).kind).toBe('record');
  });
  it('recognises the header line', () => {
    expect(checkRecord({ trace: 1, title: 'Kestrel K65 on bench 2' })).toMatchObject({ kind: 'header' });
    expect(traceHeaderSchema.safeParse({ trace: 1, capturedAt: '2026-11-30T09:12:00Z' }).success).toBe(true);
  });
  it('names the field that is wrong', () => {
    expect(checkRecord({ t: 1.5, note: 'x' })).toMatchObject({ kind: 'invalid', reason: expect.stringMatching(/^t:/) });
    expect(checkRecord({ t: 1, msg: 'zz' })).toMatchObject({ reason: expect.stringMatching(/^msg:/) });
    expect(checkRecord({ t: 1, event: 'reboot' })).toMatchObject({ reason: expect.stringMatching(/^event:/) });
    expect(checkRecord({ t: 1, vbus: { ma: 3 } })).toMatchObject({ reason: expect.stringMatching(/^vbus\.mv:/) });
    expect(checkRecord({ t: 1 })).toMatchObject({ reason: 'a record needs msg, event, vbus or note' });
  });

  const scalar = fc.oneof(fc.integer({ min: -5, max: 200_000 }), fc.double(), fc.boolean(), fc.constant(null), fc.string({ maxLength: 6 }));
  const field = (values: fc.Arbitrary<unknown>) => fc.option(fc.oneof(values, scalar), { nil: undefined });
  const candidate = fc.record(
    {
      t: field(fc.nat(1_000_000)),
      msg: field(fc.constantFrom('a161', '41 00', '0xa1:61', 'a16', 'zz')),
      from: field(fc.constantFrom('source', 'sink', 'cable', 'host')),
      sop: field(fc.constantFrom('SOP', "SOP'", "SOP''", 'SOP3')),
      crc: field(fc.constantFrom('0a1b2c3d', '0x0A1B2C3D', '123')),
      crcOk: field(fc.boolean()),
      event: field(fc.constantFrom('attach', 'detach', 'hard_reset', 'cable_reset', 'boot')),
      cc: field(fc.constantFrom('CC1', 'CC2', 'CC3')),
      rp: field(fc.constantFrom('default', '1.5A', '3.0A', '5A')),
      vbus: field(fc.record({ mv: field(fc.nat(20_000)), ma: field(fc.integer({ min: -100, max: 5_000 })) }, { requiredKeys: [] })),
      note: field(fc.string()),
    },
    { requiredKeys: [] },
  );
  it('agrees with traceRecordSchema on every candidate record', () => {
    fc.assert(
      fc.property(candidate, (raw) => {
        const value = JSON.parse(JSON.stringify(raw)) as Record<string, unknown>;
        if (value.trace !== undefined) return;
        const checked = checkRecord(value);
        expect(checked.kind === 'record').toBe(traceRecordSchema.safeParse(value).success);
      }),
      { numRuns: 2_000 },
    );
  });
});
