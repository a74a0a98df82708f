import { describe, expect, it } from 'vitest';
import { encodeShared } from '../../../lib/share-url.ts';
import { encodeOffersState, initialPageState, OFFERS_STATE_PARAM, offersStateFromParams, type OffersPageState } from './offers-url.ts';

const params = (value: string) => new URLSearchParams({ [OFFERS_STATE_PARAM]: value });

describe('the Offers page state in its URL', () => {
  it('reads back what it wrote: offers, cable, PDP and the sink policy', () => {
    const state: OffersPageState = {
      form: {
        offers: [
          { kind: 'fixed', voltageMv: 5_000, maxCurrentMa: 3_000 },
          { kind: 'pps', minVoltageMv: 3_300, maxVoltageMv: 11_000, maxCurrentMa: 3_000 },
        ],
        pdpW: '',
        cable: '5000',
        label: '',
        epr: false,
      },
      policy: { kind: 'pps', voltageMv: 8_400, currentMa: 2_500 },
    };
    const read = offersStateFromParams(params(encodeOffersState(state)));
    expect(read).toEqual({ ok: true, state });
  });

  it('carries nothing without the parameter', () => {
    expect(offersStateFromParams(new URLSearchParams())).toBeNull();
  });

  it('refuses a damaged value and one the form would not accept, saying which field', () => {
    expect(offersStateFromParams(params('not-deflate'))).toMatchObject({ ok: false, error: { code: 'offers.link-damaged' } });
    const bad = encodeShared({ ...initialPageState, form: { ...initialPageState.form, cable: '7000' } });
    const read = offersStateFromParams(params(bad));
    expect(read).toMatchObject({ ok: false, error: { code: 'offers.link-invalid' } });
    expect(read?.ok === false && read.error.message).toContain('form.cable');
    const badPolicy = encodeShared({ ...initialPageState, policy: { kind: 'fixed', voltageMv: '9000', currentMa: 3_000 } });
    expect(offersStateFromParams(params(badPolicy))).toMatchObject({ ok: false, error: { code: 'offers.link-invalid' } });
  });

  it('leaves out a policy still being typed: the link opens with the default policy', () => {
    const state: OffersPageState = { form: initialPageState.form };
    expect(offersStateFromParams(params(encodeOffersState(state)))).toEqual({ ok: true, state });
  });
});
