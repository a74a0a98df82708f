/**
 * The Offers page's state in its URL (`?page=…`): the offers, PDP, cable, printed rating, EPR flag
 * and the sink policy (when it is a valid one), deflated and base64url-encoded (src/lib/share-url.ts), so a reload or
 * a copied link opens the same page. A damaged or out-of-date value gives the defaults and says so.
 */
import { z } from 'zod';
import { decodeShared, encodeShared } from '../../../lib/share-url.ts';
import { fail, type Result } from '../../../../shared/core/result.ts';
import { zodMessage } from '../../../../shared/core/zod-message.ts';
import { sinkPolicySchema, type SinkPolicy } from '../../../../shared/rules/sink-policy.ts';
import { initialPolicy } from '../components/contract-panel.tsx';
import { initialFormValues, offersFormSchema, type OffersFormValues } from './offers-form.ts';

export const OFFERS_STATE_PARAM = 'page';

/** A policy being typed (a field empty or out of range) is left out; the link then opens with the default policy. */
export type OffersPageState = { form: OffersFormValues; policy?: SinkPolicy };

const pageStateSchema = z.object({ form: offersFormSchema, policy: sinkPolicySchema.optional() });

export const initialPageState: OffersPageState = { form: initialFormValues, policy: initialPolicy };

export function encodeOffersState(state: OffersPageState): string {
  return encodeShared(state);
}

/** The state a URL carries; null when it carries none (the page starts from its defaults). */
export function offersStateFromParams(params: URLSearchParams): Result<{ state: OffersPageState }> | null {
  const text = params.get(OFFERS_STATE_PARAM);
  if (text === null || text === '') return null;
  const decoded = decodeShared(text);
  if (!decoded.ok) return fail('offers.link-damaged', 'The offers in this link are damaged or incomplete: the page shows its defaults.');
  const parsed = pageStateSchema.safeParse(decoded.value);
  if (!parsed.success) return fail('offers.link-invalid', `The offers in this link cannot be used (${zodMessage(parsed.error, { limit: 1 })}): the page shows its defaults.`);
  return { ok: true, state: parsed.data };
}
