import { describe, expect, it } from 'vitest';
import { defaultOffer, offerInputSchema } from '../../../shared/rules/offer-input.ts';
import { sinkPolicySchema } from '../../../shared/rules/sink-policy.ts';
import { offerFields, offerKindOptions, offerKinds } from './offer-fields.ts';
import { defaultPolicy, policyFields, policyKindHelp, policyKindOptions } from './policy-fields.ts';

describe('offer form fields', () => {
  it('shows every key of every kind of offer, and nothing else', () => {
    expect(offerKindOptions.map((o) => o.value)).toEqual(['fixed', 'variable', 'battery', 'pps', 'spr-avs', 'epr-avs']);
    for (const kind of offerKinds) {
      const keys = Object.keys(defaultOffer(kind))
        .filter((key) => key !== 'kind')
        .sort();
      expect(offerFields[kind].map((f) => f.name).sort(), kind).toEqual(keys);
    }
  });

  it("steps by the engine's own units, so a stepped default stays valid", () => {
    // Units of the PDO fields (USB PD R3.1 V1.8 Tables 6-9 to 6-14, from memory, as offer-input.ts).
    expect(offerFields.fixed.map((f) => f.step)).toEqual([50, 10]);
    expect(offerFields.pps.map((f) => f.step)).toEqual([100, 100, 50]);
    for (const kind of offerKinds) {
      for (const field of offerFields[kind]) {
        const offer = defaultOffer(kind) as Record<string, unknown>;
        const stepped = { ...offer, [field.name]: (offer[field.name] as number) + field.step };
        expect(offerInputSchema.safeParse(stepped).success, `${kind}.${field.name} + ${field.step}`).toBe(true);
        if (field.step > 1) {
          const halfStep = { ...offer, [field.name]: (offer[field.name] as number) + field.step / 2 };
          expect(offerInputSchema.safeParse(halfStep).success, `${kind}.${field.name} + half a step`).toBe(false);
        }
      }
    }
  });
});

describe('sink policy form fields', () => {
  it('has short labels, a sentence of help, and the fields of its defaults', () => {
    for (const { value, label } of policyKindOptions) {
      // Short enough for the Bench's narrowest drop-down (about 20 characters at 14 px).
      expect(label.length, value).toBeLessThanOrEqual(20);
      expect(policyKindHelp[value].length, value).toBeGreaterThan(20);
      const policy = defaultPolicy(value);
      expect(sinkPolicySchema.safeParse(policy).success, value).toBe(true);
      expect(policyFields[value].map((f) => f.name).sort()).toEqual(
        Object.keys(policy)
          .filter((key) => key !== 'kind')
          .sort(),
      );
    }
  });
});
