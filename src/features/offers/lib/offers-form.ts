/** The Offers page's form: the source's offers (engine schema) and how they are checked. */
import { z } from 'zod';
import { offerListSchema, type OfferInput } from '../../../../shared/rules/offer-input.ts';

export const cableOptions = [
  { value: 'unknown', label: 'Not known' },
  { value: '3000', label: '3 A (any USB Type-C cable)' },
  { value: '5000', label: '5 A (electronically marked)' },
] as const;

export const offersFormSchema = z.object({
  offers: offerListSchema,
  pdpW: z
    .string()
    .trim()
    .refine((s) => s === '' || (/^\d+$/.test(s) && Number(s) >= 1 && Number(s) <= 240), 'Enter whole watts from 1 to 240, or leave empty to infer the PDP.'),
  cable: z.enum(['unknown', '3000', '5000']),
  label: z.string().max(200, 'Use at most 200 characters.'),
  epr: z.boolean(),
});

export type OffersFormValues = z.infer<typeof offersFormSchema>;

export const initialOffers: OfferInput[] = [
  { kind: 'fixed', voltageMv: 5_000, maxCurrentMa: 3_000 },
  { kind: 'fixed', voltageMv: 9_000, maxCurrentMa: 3_000 },
  { kind: 'fixed', voltageMv: 15_000, maxCurrentMa: 3_000 },
  { kind: 'fixed', voltageMv: 20_000, maxCurrentMa: 2_250 },
];

export const initialFormValues: OffersFormValues = { offers: initialOffers, pdpW: '45', cable: 'unknown', label: '', epr: false };

export const kindLabels: Record<OfferInput['kind'], string> = {
  fixed: 'Fixed',
  variable: 'Variable',
  battery: 'Battery',
  pps: 'PPS',
  'spr-avs': 'SPR AVS',
  'epr-avs': 'EPR AVS',
};

/** The numeric fields of each kind, with their labels and steps (the PDO field steps). */
export const kindFields: Record<OfferInput['kind'], { name: string; label: string; step: number }[]> = {
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
