import { describe, expect, it } from 'vitest';
import { buildOffers, defaultOffer, offerInputOf, type OfferKind } from './offer-input.ts';

describe('offer input', () => {
  it('builds PDOs with their raw words (5 V 3 A fixed = 0x0001912c, USB PD R3.1 V1.8 Table 6-9, from memory)', () => {
    const r = buildOffers([
      { kind: 'fixed', voltageMv: 5_000, maxCurrentMa: 3_000 },
      { kind: 'pps', minVoltageMv: 3_300, maxVoltageMv: 21_000, maxCurrentMa: 3_000 },
    ]);
    expect(r.ok && r.pdos.map((p) => p.raw)).toEqual(['0x0001912c', '0xc1a4213c']);
  });
  it('round-trips every kind through offerInputOf', () => {
    const kinds: OfferKind[] = ['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs'];
    const r = buildOffers(kinds.map(defaultOffer));
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.pdos.map(offerInputOf)).toEqual(kinds.map(defaultOffer));
  });
  it('explains bad values as "field: message"', () => {
    expect(buildOffers([{ kind: 'fixed', voltageMv: 5_010, maxCurrentMa: 3_000 }])).toMatchObject({ ok: false, error: { message: 'offers.0.voltageMv: must be a multiple of 50 mV' } });
    expect(buildOffers([{ kind: 'pps', minVoltageMv: 11_000, maxVoltageMv: 3_300, maxCurrentMa: 3_000 }])).toMatchObject({
      ok: false,
      error: { message: 'offers.0.maxVoltageMv: must not be below the minimum voltage' },
    });
    expect(buildOffers([])).toMatchObject({ ok: false, error: { message: 'offers: add at least one offer' } });
  });
});
