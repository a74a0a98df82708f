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
