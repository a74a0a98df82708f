/**
 * The Request a sink with one of vector.md's four policies sends for a list of offers.
 *
 * - max-power: the fixed, variable or battery offer with the most power through the cable; on a
 *   tie the lower voltage. Operating = Maximum Operating current (or power) = what it gives.
 * - fixed: that voltage at that current (rounded up to the RDO's 10 mA step); offered with less,
 *   that offer at its full current with Capability Mismatch; not offered, vSafe5V with Capability
 *   Mismatch. With Capability Mismatch, Maximum Operating Current states what the sink wanted
 *   (allowed above the offer: USB PD R3.1 V1.8 §6.4.2.x Capability Mismatch — from memory).
 * - pps: a PPS offer whose range holds the voltage (the first with enough current, else the one
 *   with the most); voltage rounded down to 20 mV, current down to 50 mA (the PPS RDO's steps,
 *   R3.1 V1.8 Table 6-25 — from memory); none holds it: vSafe5V with Capability Mismatch.
 * - avs: an adjustable-voltage offer (SPR AVS 9–20 V, EPR AVS) whose range holds the voltage; voltage
 *   rounded down to 100 mV, current to 50 mA (USB PD R3.2 V1.1 §6.4.2 AVS RDO: 25 mV units with the
 *   two low bits zero — from memory); the current is capped at the offer (SPR AVS: its 15 V or 20 V
 *   current; EPR AVS: PDP ÷ voltage) and the cable; none holds it: vSafe5V with Capability Mismatch.
 * - range: the lowest-voltage fixed or variable offer inside the range with enough power; none
 *   with enough: the strongest offer in the range with Capability Mismatch; none in the range:
 *   vSafe5V with Capability Mismatch.
 * Every current is capped at the offer and at the cable (default 3 A); EPR offers are considered
 * only with `epr: true`, and a request for one sets EPR Mode Capable.
 */
import { encodeRdo, hex32 } from '../pd/index.ts';
import type { FixedSourcePdo, Rdo, SourcePdo } from '../pd/types.ts';
import { contractOf } from './contract-of.ts';
import { DEFAULT_CABLE_MA, FIRST_EPR_POSITION, isEprPdo, isPadding, powerMw } from './pdo-facts.ts';
import type { ChooseRequestOptions, ChosenRequest, SinkPolicy } from './sink-policy.ts';

interface Offer {
  pdo: SourcePdo;
  position: number;
}

/** The largest count the fixed RDO's 10-bit current fields hold, in mA. */
const RDO_MAX_CURRENT_MA = 1_023 * 10;
const RDO_MAX_POWER_MW = 1_023 * 250;

const down = (value: number, step: number) => Math.floor(value / step) * step;
const up = (value: number, step: number) => Math.ceil(value / step) * step;

/** The voltage an offer is sure to give (fixed: its voltage; variable, battery: the minimum). */
function baseVoltageMv(pdo: SourcePdo): number {
  return pdo.kind === 'fixed' ? pdo.voltageMv : 'minVoltageMv' in pdo ? pdo.minVoltageMv : 0;
}

/** The power an offer guarantees through the cable, in mW (fixed, variable, battery). */
function guaranteedMw(pdo: SourcePdo, cableMa: number): number {
  if (pdo.kind === 'fixed' || pdo.kind === 'variable') return powerMw(baseVoltageMv(pdo), Math.min(pdo.maxCurrentMa, cableMa));
  if (pdo.kind === 'battery') return Math.min(pdo.maxPowerMw, powerMw(pdo.minVoltageMv, cableMa));
  return 0;
}

export function chooseRequest(pdos: readonly SourcePdo[], policy: SinkPolicy, options: ChooseRequestOptions = {}): ChosenRequest {
  const cableMa = options.cableMa ?? DEFAULT_CABLE_MA;
  const offers: Offer[] = pdos
    .map((pdo, i) => ({ pdo, position: i + 1 }))
    // The RDO's Object Position has 4 bits, so positions above 15 cannot be requested.
    .filter((o) => !isPadding(o.pdo) && o.position <= 15 && (options.epr || (!isEprPdo(o.pdo) && o.position < FIRST_EPR_POSITION)));
  const flags = (position: number, capabilityMismatch: boolean) => ({
    objectPosition: position,
    capabilityMismatch,
    usbCommunicationsCapable: policy.usbCommunicationsCapable ?? false,
    noUsbSuspend: policy.noUsbSuspend ?? false,
    unchunkedExtendedMessages: policy.unchunkedExtendedMessages ?? false,
    eprModeCapable: (policy.eprModeCapable ?? false) || position >= FIRST_EPR_POSITION,
  });

  /** A fixed or variable request; `wantMa` is what the sink needs (stated when it is not met). */
  const currentRequest = (offer: Offer, wantMa: number): Rdo => {
    const offerMa = offer.pdo.kind === 'fixed' || offer.pdo.kind === 'variable' ? offer.pdo.maxCurrentMa : 0;
    const operatingCurrentMa = Math.min(wantMa, offerMa, cableMa, RDO_MAX_CURRENT_MA);
    const mismatch = operatingCurrentMa < wantMa;
    const maxOperatingCurrentMa = mismatch ? Math.min(wantMa, RDO_MAX_CURRENT_MA) : operatingCurrentMa;
    const kind = offer.pdo.kind === 'variable' ? 'rdo-variable' : 'rdo-fixed';
    return { kind, raw: '', ...flags(offer.position, mismatch), operatingCurrentMa: down(operatingCurrentMa, 10), maxOperatingCurrentMa: down(maxOperatingCurrentMa, 10), giveBack: false };
  };
  const vSafe5V = (): Offer => offers.find((o) => o.pdo.kind === 'fixed' && o.pdo.voltageMv === 5_000) ?? offers[0] ?? { pdo: fallbackPdo, position: 1 };
  const fallbackRequest = (wantMa: number): [Offer, Rdo] => {
    const offer = vSafe5V();
    const rdo = currentRequest(offer, wantMa);
    return [offer, { ...rdo, capabilityMismatch: true }];
  };

  let chosen: [Offer, Rdo];
  switch (policy.kind) {
    case 'max-power': {
      const ranked = offers
        .filter((o) => o.pdo.kind === 'fixed' || o.pdo.kind === 'variable' || o.pdo.kind === 'battery')
        .sort((a, b) => guaranteedMw(b.pdo, cableMa) - guaranteedMw(a.pdo, cableMa) || baseVoltageMv(a.pdo) - baseVoltageMv(b.pdo) || a.position - b.position);
      const best = ranked[0];
      if (!best) chosen = fallbackRequest(0);
      else if (best.pdo.kind === 'battery') {
        const operatingPowerMw = down(Math.min(guaranteedMw(best.pdo, cableMa), RDO_MAX_POWER_MW), 250);
        chosen = [best, { kind: 'rdo-battery', raw: '', ...flags(best.position, false), operatingPowerMw, maxOperatingPowerMw: operatingPowerMw, giveBack: false }];
      } else {
        const offerMa = best.pdo.kind === 'fixed' || best.pdo.kind === 'variable' ? best.pdo.maxCurrentMa : 0;
        chosen = [best, currentRequest(best, Math.min(offerMa, cableMa))];
      }
      break;
    }
    case 'fixed': {
      const wantMa = up(policy.currentMa, 10);
      const offer = offers.find((o) => o.pdo.kind === 'fixed' && o.pdo.voltageMv === policy.voltageMv);
      chosen = offer ? [offer, currentRequest(offer, wantMa)] : fallbackRequest(wantMa);
      break;
    }
    case 'pps': {
      const voltageMv = down(policy.voltageMv, 20);
      const wantMa = down(policy.currentMa, 50);
      const holding = offers.filter((o) => o.pdo.kind === 'pps' && o.pdo.minVoltageMv <= voltageMv && voltageMv <= o.pdo.maxVoltageMv);
      const currentOf = (o: Offer) => (o.pdo.kind === 'pps' ? Math.min(o.pdo.maxCurrentMa, cableMa) : 0);
      const offer = holding.find((o) => currentOf(o) >= wantMa) ?? [...holding].sort((a, b) => currentOf(b) - currentOf(a))[0];
      if (!offer) {
        chosen = fallbackRequest(wantMa);
        break;
      }
      const operatingCurrentMa = down(Math.min(wantMa, currentOf(offer), 127 * 50), 50);
      chosen = [offer, { kind: 'rdo-pps', raw: '', ...flags(offer.position, operatingCurrentMa < wantMa), outputVoltageMv: voltageMv, operatingCurrentMa }];
      break;
    }
    case 'avs': {
      const voltageMv = down(policy.voltageMv, 100);
      const wantMa = down(policy.currentMa, 50);
      const holding = offers.filter((o) => {
        if (o.pdo.kind === 'epr-avs') return o.pdo.minVoltageMv <= voltageMv && voltageMv <= o.pdo.maxVoltageMv;
        if (o.pdo.kind === 'spr-avs') return voltageMv >= 9_000 && voltageMv <= (o.pdo.maxCurrent20vMa > 0 ? 20_000 : 15_000);
        return false;
      });
      const currentOf = (o: Offer) => {
        const offerMa =
          o.pdo.kind === 'epr-avs'
            ? Math.floor((o.pdo.pdpW * 1_000_000) / Math.max(voltageMv, 1))
            : o.pdo.kind === 'spr-avs'
              ? voltageMv <= 15_000
                ? o.pdo.maxCurrent15vMa
                : o.pdo.maxCurrent20vMa
              : 0;
        return Math.min(offerMa, cableMa);
      };
      const offer = holding.find((o) => currentOf(o) >= wantMa) ?? [...holding].sort((a, b) => currentOf(b) - currentOf(a))[0];
      if (!offer) {
        chosen = fallbackRequest(wantMa);
        break;
      }
      const operatingCurrentMa = down(Math.min(wantMa, currentOf(offer), 127 * 50), 50);
      chosen = [offer, { kind: 'rdo-avs', raw: '', ...flags(offer.position, operatingCurrentMa < wantMa), outputVoltageMv: voltageMv, operatingCurrentMa }];
      break;
    }
    case 'range': {
      const inRange = offers
        .filter((o) =>
          o.pdo.kind === 'fixed'
            ? o.pdo.voltageMv >= policy.minVoltageMv && o.pdo.voltageMv <= policy.maxVoltageMv
            : o.pdo.kind === 'variable' && o.pdo.minVoltageMv >= policy.minVoltageMv && o.pdo.maxVoltageMv <= policy.maxVoltageMv,
        )
        .sort((a, b) => baseVoltageMv(a.pdo) - baseVoltageMv(b.pdo) || a.position - b.position);
      const needMa = (o: Offer) => up(Math.ceil((policy.powerMw * 1_000) / Math.max(baseVoltageMv(o.pdo), 1)), 10);
      const enough = inRange.find((o) => guaranteedMw(o.pdo, cableMa) >= policy.powerMw);
      const strongest = [...inRange].sort((a, b) => guaranteedMw(b.pdo, cableMa) - guaranteedMw(a.pdo, cableMa))[0];
      const offer = enough ?? strongest;
      chosen = offer ? [offer, currentRequest(offer, needMa(offer))] : fallbackRequest(up(Math.ceil(policy.powerMw / 5), 10));
      break;
    }
  }

  const [offer, draft] = chosen;
  const rdoRaw = encodeRdo(draft);
  const rdo: Rdo = { ...draft, raw: hex32(rdoRaw) };
  return { rdoRaw, rdo, objectPosition: offer.position, capabilityMismatch: rdo.capabilityMismatch, contract: contractOf(rdo, offer.pdo) };
}

/** Only when there are no offers at all: a request for position 1 at nothing. */
const fallbackPdo: FixedSourcePdo = {
  kind: 'fixed',
  raw: '0x00000000',
  voltageMv: 5_000,
  maxCurrentMa: 0,
  peakCurrent: 0,
  dualRolePower: false,
  usbSuspendSupported: false,
  unconstrainedPower: false,
  usbCommunicationsCapable: false,
  dualRoleData: false,
  unchunkedExtendedMessages: false,
  eprModeCapable: false,
};
