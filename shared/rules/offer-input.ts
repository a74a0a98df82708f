/**
 * Offers as people enter them (the Offers page's form, API bodies): one plain object per PDO with
 * its numbers in the units of the PDO's fields, validated by zod with "field: message" errors, and
 * the conversions to and from decoded PDOs. Field steps are the PDOs' own (USB PD R3.1 V1.8
 * Tables 6-9 to 6-14, from memory): fixed/variable/battery voltage 50 mV, current 10 mA, power
 * 250 mW; PPS voltage 100 mV, current 50 mA; EPR AVS voltage 100 mV, PDP 1 W; SPR AVS current 10 mA.
 */
import { z } from 'zod';
import { fail, type Result } from '../core/result.ts';
import type { SourcePdo } from '../pd/types.ts';
import { batteryPdo, eprAvsApdo, fixedPdo, ppsApdo, sprAvsApdo, variablePdo } from './pdo-builders.ts';
import { zodMessage } from '../core/zod-message.ts';

const step = (unit: string, size: number, max: number) =>
  z
    .number({ error: 'enter a number' })
    .int(`must be a whole number of ${unit}`)
    .min(0, `must be at least 0 ${unit}`)
    .max(max, `must be at most ${max} ${unit}`)
    .refine((v) => v % size === 0, `must be a multiple of ${size} ${unit}`);

const mv50 = step('mV', 50, 51_150);
const ma10 = step('mA', 10, 10_230);
const mv100 = step('mV', 100, 25_500);

export const offerInputSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('fixed'), voltageMv: mv50, maxCurrentMa: ma10 }),
  z.object({ kind: z.literal('variable'), minVoltageMv: mv50, maxVoltageMv: mv50, maxCurrentMa: ma10 }),
  z.object({ kind: z.literal('battery'), minVoltageMv: mv50, maxVoltageMv: mv50, maxPowerMw: step('mW', 250, 255_750) }),
  z.object({ kind: z.literal('pps'), minVoltageMv: mv100, maxVoltageMv: mv100, maxCurrentMa: step('mA', 50, 6_350) }),
  z.object({ kind: z.literal('epr-avs'), minVoltageMv: mv100, maxVoltageMv: step('mV', 100, 51_100), pdpW: z.number().int().min(0).max(255) }),
  z.object({ kind: z.literal('spr-avs'), maxCurrent15vMa: ma10, maxCurrent20vMa: ma10 }),
]);

export type OfferInput = z.infer<typeof offerInputSchema>;
export type OfferKind = OfferInput['kind'];

export const offerListSchema = z
  .array(offerInputSchema)
  .min(1, 'add at least one offer')
  .max(13, 'at most 13 offers (7 SPR and 6 EPR positions)')
  .superRefine((offers, ctx) => {
    offers.forEach((o, i) => {
      if ('minVoltageMv' in o && o.minVoltageMv > o.maxVoltageMv) ctx.addIssue({ code: 'custom', path: [i, 'maxVoltageMv'], message: 'must not be below the minimum voltage' });
    });
  });

/** A blank offer of a kind, with typical values. */
export function defaultOffer(kind: OfferKind): OfferInput {
  switch (kind) {
    case 'fixed':
      return { kind, voltageMv: 9_000, maxCurrentMa: 3_000 };
    case 'variable':
      return { kind, minVoltageMv: 5_000, maxVoltageMv: 20_000, maxCurrentMa: 2_000 };
    case 'battery':
      return { kind, minVoltageMv: 5_000, maxVoltageMv: 20_000, maxPowerMw: 30_000 };
    case 'pps':
      return { kind, minVoltageMv: 3_300, maxVoltageMv: 21_000, maxCurrentMa: 3_000 };
    case 'epr-avs':
      return { kind, minVoltageMv: 15_000, maxVoltageMv: 28_000, pdpW: 140 };
    case 'spr-avs':
      return { kind, maxCurrent15vMa: 3_000, maxCurrent20vMa: 2_250 };
  }
}

export function offerInputOf(pdo: SourcePdo): OfferInput {
  switch (pdo.kind) {
    case 'fixed':
      return { kind: 'fixed', voltageMv: pdo.voltageMv, maxCurrentMa: pdo.maxCurrentMa };
    case 'variable':
      return { kind: 'variable', minVoltageMv: pdo.minVoltageMv, maxVoltageMv: pdo.maxVoltageMv, maxCurrentMa: pdo.maxCurrentMa };
    case 'battery':
      return { kind: 'battery', minVoltageMv: pdo.minVoltageMv, maxVoltageMv: pdo.maxVoltageMv, maxPowerMw: pdo.maxPowerMw };
    case 'pps':
      return { kind: 'pps', minVoltageMv: pdo.minVoltageMv, maxVoltageMv: pdo.maxVoltageMv, maxCurrentMa: pdo.maxCurrentMa };
    case 'epr-avs':
      return { kind: 'epr-avs', minVoltageMv: pdo.minVoltageMv, maxVoltageMv: pdo.maxVoltageMv, pdpW: pdo.pdpW };
    case 'spr-avs':
      return { kind: 'spr-avs', maxCurrent15vMa: pdo.maxCurrent15vMa, maxCurrent20vMa: pdo.maxCurrent20vMa };
  }
}

/** Validated offers → decoded PDOs (with their raw words). Never throws. */
export function buildOffers(input: unknown): Result<{ pdos: SourcePdo[] }> {
  const parsed = offerListSchema.safeParse(input);
  if (!parsed.success) {
    return fail('input.offers', zodMessage(parsed.error, { prefix: 'offers', limit: 1 }));
  }
  try {
    const pdos = parsed.data.map((o): SourcePdo => {
      switch (o.kind) {
        case 'fixed':
          return fixedPdo(o.voltageMv, o.maxCurrentMa);
        case 'variable':
          return variablePdo(o.minVoltageMv, o.maxVoltageMv, o.maxCurrentMa);
        case 'battery':
          return batteryPdo(o.minVoltageMv, o.maxVoltageMv, o.maxPowerMw);
        case 'pps':
          return ppsApdo(o.minVoltageMv, o.maxVoltageMv, o.maxCurrentMa);
        case 'epr-avs':
          return eprAvsApdo(o.minVoltageMv, o.maxVoltageMv, o.pdpW);
        case 'spr-avs':
          return sprAvsApdo(o.maxCurrent15vMa, o.maxCurrent20vMa);
        default:
          return o satisfies never;
      }
    });
    return { ok: true, pdos };
  } catch (error) {
    return fail('input.offers', `offers: ${error instanceof Error ? error.message : String(error)}`);
  }
}
