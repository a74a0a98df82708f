/**
 * How the offer forms (Offers page, Bench) show a source's offers: a label per PDO kind and the
 * numeric fields of each kind, in the units and steps of the PDO's own fields. The values
 * themselves, their zod schema, the defaults per kind and the conversion to PDO words live in the
 * engine (`shared/rules/offer-input.ts`: `offerInputSchema`, `defaultOffer`, `buildOffers`).
 */
import type { OfferInput, OfferKind } from '../../../shared/rules/offer-input.ts';

/** One numeric input of a form: the value's key, its label with the unit, the input's step. */
export type NumberFieldSpec<Name extends string = string> = { name: Name; label: string; step: number };

/** A controlled number input's text: empty while the number is not (yet) one (NaN, missing). */
export const numberInputText = (value: unknown): string => (typeof value === 'number' && Number.isFinite(value) ? String(value) : '');

/** A number input's text as the number it holds; NaN while it is empty, so validation names the field. */
export const numberFromInput = (text: string): number => (text === '' ? Number.NaN : Number(text));

/** Every numeric key an offer of some kind carries. */
export type OfferNumberKey = Exclude<OfferInput extends infer O ? (O extends unknown ? keyof O : never) : never, 'kind'>;

export const offerKindLabels: Record<OfferKind, string> = {
  fixed: 'Fixed',
  variable: 'Variable',
  battery: 'Battery',
  pps: 'PPS',
  'spr-avs': 'SPR AVS',
  'epr-avs': 'EPR AVS',
};

export const offerKinds = Object.keys(offerKindLabels) as OfferKind[];

export const offerKindOptions: readonly { value: OfferKind; label: string }[] = offerKinds.map((kind) => ({ value: kind, label: offerKindLabels[kind] }));

// Steps are the PDO fields' units (shared/rules/offer-input.ts): 50 mV / 10 mA / 250 mW for fixed,
// variable and battery; 100 mV / 50 mA for PPS; 100 mV / 1 W for EPR AVS; 10 mA for SPR AVS.
export const offerFields: Record<OfferKind, readonly NumberFieldSpec<OfferNumberKey>[]> = {
  fixed: [
    { name: 'voltageMv', label: 'Voltage (mV)', step: 50 },
    { name: 'maxCurrentMa', label: 'Max current (mA)', step: 10 },
  ],
  variable: [
    { name: 'minVoltageMv', label: 'Min voltage (mV)', step: 50 },
    { name: 'maxVoltageMv', label: 'Max voltage (mV)', step: 50 },
    { name: 'maxCurrentMa', label: 'Max current (mA)', step: 10 },
  ],
  battery: [
    { name: 'minVoltageMv', label: 'Min voltage (mV)', step: 50 },
    { name: 'maxVoltageMv', label: 'Max voltage (mV)', step: 50 },
    { name: 'maxPowerMw', label: 'Max power (mW)', step: 250 },
  ],
  pps: [
    { name: 'minVoltageMv', label: 'Min voltage (mV)', step: 100 },
    { name: 'maxVoltageMv', label: 'Max voltage (mV)', step: 100 },
    { name: 'maxCurrentMa', label: 'Max current (mA)', step: 50 },
  ],
  'spr-avs': [
    { name: 'maxCurrent15vMa', label: 'Current 9–15 V (mA)', step: 10 },
    { name: 'maxCurrent20vMa', label: 'Current 15–20 V (mA)', step: 10 },
  ],
  'epr-avs': [
    { name: 'minVoltageMv', label: 'Min voltage (mV)', step: 100 },
    { name: 'maxVoltageMv', label: 'Max voltage (mV)', step: 100 },
    { name: 'pdpW', label: 'PDP (W)', step: 1 },
  ],
};
