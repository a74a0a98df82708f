import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeHeader, EXT_RESERVED_MASK, HEADER_CABLE_RESERVED_MASK } from './header.ts';
import { decodeFields, reservedMask, fieldCount, type WordLayout } from './layout.ts';
import { EXTENDED_HEADER_LAYOUT, HEADER_CABLE_LAYOUT, HEADER_SOP_LAYOUT, RDO_LAYOUTS, SINK_PDO_LAYOUTS, SOURCE_PDO_LAYOUTS } from './layouts-power.ts';
import { decodeRdo, RDO_RESERVED_MASKS } from './rdo.ts';
import { decodeSinkPdo, SINK_RESERVED_MASKS } from './sink-pdo.ts';
import { decodeSourcePdo, SOURCE_RESERVED_MASKS } from './source-pdo.ts';

/** Every bit of a layout belongs to exactly one field. */
function coversEveryBit(layout: WordLayout): void {
  let seen = 0;
  for (const f of layout.fields) {
    for (let b = f.lo; b <= f.hi; b++) {
      expect(seen & (1 << b), `${layout.title}: bit ${b} twice`).toBe(0);
      seen |= 1 << b;
    }
  }
  expect(seen >>> 0, layout.title).toBe(layout.bits === 32 ? 0xffff_ffff : 0xffff);
}

function viaLayout(raw: number, layout: WordLayout): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  decodeFields(raw, layout, out);
  return out;
}

const all = [HEADER_SOP_LAYOUT, HEADER_CABLE_LAYOUT, EXTENDED_HEADER_LAYOUT, ...Object.values(SOURCE_PDO_LAYOUTS), ...Object.values(SINK_PDO_LAYOUTS), ...Object.values(RDO_LAYOUTS)];

describe('power layouts', () => {
  it.each(all.map((l) => [l.title, l] as const))('%s covers every bit once', (_, layout) => coversEveryBit(layout));

  it('reserved masks of the fast readers equal the layouts (source, sink, RDO, headers)', () => {
    for (const [kind, layout] of Object.entries(SOURCE_PDO_LAYOUTS)) expect(SOURCE_RESERVED_MASKS[kind as keyof typeof SOURCE_RESERVED_MASKS] >>> 0, kind).toBe(reservedMask(layout));
    for (const [kind, layout] of Object.entries(SINK_PDO_LAYOUTS)) expect(SINK_RESERVED_MASKS[kind as keyof typeof SINK_RESERVED_MASKS] >>> 0, kind).toBe(reservedMask(layout));
    expect(RDO_RESERVED_MASKS.fixed >>> 0).toBe(reservedMask(RDO_LAYOUTS['rdo-fixed']!));
    expect(RDO_RESERVED_MASKS.programmable >>> 0).toBe(reservedMask(RDO_LAYOUTS['rdo-pps']!));
    expect(HEADER_CABLE_RESERVED_MASK).toBe(reservedMask(HEADER_CABLE_LAYOUT));
    expect(EXT_RESERVED_MASK).toBe(reservedMask(EXTENDED_HEADER_LAYOUT));
  });

  it('the fast readers agree with the layouts on random words', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 0xffff_ffff }), (raw) => {
        const src = decodeSourcePdo(raw);
        const srcLayout = SOURCE_PDO_LAYOUTS[src.kind];
        if (srcLayout) {
          const { kind: _k, raw: _r, ...fields } = src;
          // The sink-only forms read Power Limited / peak bits as false/0; the source layout has them.
          expect(fields).toEqual(viaLayout(raw, srcLayout));
        }
        const sink = decodeSinkPdo(raw);
        const sinkLayout = SINK_PDO_LAYOUTS[sink.kind];
        if (sinkLayout) {
          const { kind: _k, raw: _r, ...fields } = sink as unknown as Record<string, unknown>;
          const expected = viaLayout(raw, sinkLayout);
          if (sink.kind === 'pps') expected.powerLimited = false;
          if (sink.kind === 'epr-avs' || sink.kind === 'spr-avs') expected.peakCurrent = (raw >>> 26) & 3;
          expect(fields).toEqual(expected);
        }
        for (const [ref, kind] of [
          [{ kind: 'fixed' }, 'rdo-fixed'],
          [{ kind: 'battery' }, 'rdo-battery'],
          [{ kind: 'pps' }, 'rdo-pps'],
          [{ kind: 'epr-avs' }, 'rdo-avs'],
        ] as const) {
          const { kind: k, raw: _r, ...fields } = decodeRdo(raw, ref);
          expect(k).toBe(kind);
          expect(fields).toEqual(viaLayout(raw, RDO_LAYOUTS[kind]!));
        }
        const header = decodeHeader(raw & 0xffff, 'SOP');
        const h = viaLayout(raw & 0xffff, HEADER_SOP_LAYOUT);
        expect(header).toMatchObject({ extended: h.extended, numDataObjects: h.numDataObjects, messageId: h.messageId, powerRole: h.powerRole, specRevision: h.specRevision, dataRole: h.dataRole });
        expect(fieldCount(raw & 0xffff, HEADER_SOP_LAYOUT.fields.at(-1)!)).toBe(raw & 0x1f);
      }),
      { numRuns: 3000 },
    );
  });
});
