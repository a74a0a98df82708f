/**
 * The Power Rules' normative fixed voltages and currents by PDP, and the check against them.
 *
 * Source: USB PD R3.1 V1.8 §10.2.3, Table 10-2 "SPR Normative Voltages and Currents" and Table 10-3
 * "EPR Normative Voltages and Currents"; unchanged in R3.2 V1.1 §10.2.3 — from memory:
 *   PDP ≤ 15 W          5 V at PDP/5
 *   15 W < PDP ≤ 27 W   5 V 3 A, 9 V at PDP/9
 *   27 W < PDP ≤ 45 W   5 V 3 A, 9 V 3 A, 15 V at PDP/15
 *   45 W < PDP ≤ 60 W   5, 9, 15 V 3 A, 20 V at PDP/20
 *   60 W < PDP ≤ 100 W  5, 9, 15 V 3 A, 20 V at PDP/20 (above 3 A: over a 5 A cable only)
 *   EPR 100–140 W       the 100 W SPR set, 28 V at PDP/28, AVS 15–28 V
 *   EPR 140–180 W       … 28 V 5 A, 36 V at PDP/36, AVS 15–36 V
 *   EPR 180–240 W       … 28 V 5 A, 36 V 5 A, 48 V at PDP/48, AVS 15–48 V
 * PDP/V is rounded down to the PDO's 10 mA step (20 W at 9 V is offered as 2.22 A).
 */
import type { Finding } from '../core/finding.ts';
import type { SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { isPadding } from './pdo-facts.ts';

export interface RequiredFixed {
  voltageMv: number;
  currentMa: number;
}

export interface PowerRulesRequirement {
  fixed: RequiredFixed[];
  /** EPR only: the AVS range the source must offer. */
  avs?: { minVoltageMv: number; maxVoltageMv: number };
  /** The PDP the SPR part is checked at (an EPR source's SPR offers are those of 100 W). */
  sprPdpW: number;
}

const SPR_STEPS_MV = [5_000, 9_000, 15_000, 20_000] as const;
const SPR_BAND_TOPS_W = [15, 27, 45, 100] as const; // the highest voltage of band i is SPR_STEPS_MV[i]
const EPR_STEPS_MV = [28_000, 36_000, 48_000] as const;
const EPR_BAND_TOPS_W = [140, 180, 240] as const;

/** PDP/V in mA, down to the 10 mA step of a fixed PDO's current field. */
function currentForMa(pdpW: number, voltageMv: number): number {
  return Math.floor((pdpW * 1_000_000) / voltageMv / 10) * 10;
}

/** The normative offers for a PDP (`epr`: as EPR_Source_Capabilities), each current capped at `cableMa` when given. */
export function powerRulesFor(pdpW: number, options: { epr?: boolean; cableMa?: number } = {}): PowerRulesRequirement {
  const sprPdpW = Math.min(pdpW, 100);
  const fixed: RequiredFixed[] = [];
  const sprBand = SPR_BAND_TOPS_W.findIndex((top) => sprPdpW <= top);
  for (let i = 0; i <= sprBand; i++) {
    const voltageMv = SPR_STEPS_MV[i]!;
    fixed.push({ voltageMv, currentMa: i < sprBand ? 3_000 : Math.min(currentForMa(sprPdpW, voltageMv), 5_000) });
  }
  let avs: PowerRulesRequirement['avs'];
  if (options.epr && pdpW > 100) {
    const eprBand = EPR_BAND_TOPS_W.findIndex((top) => pdpW <= top);
    const band = eprBand === -1 ? EPR_BAND_TOPS_W.length - 1 : eprBand;
    for (let i = 0; i <= band; i++) {
      const voltageMv = EPR_STEPS_MV[i]!;
      fixed.push({ voltageMv, currentMa: i < band ? 5_000 : Math.min(currentForMa(pdpW, voltageMv), 5_000) });
    }
    avs = { minVoltageMv: 15_000, maxVoltageMv: EPR_STEPS_MV[band]! };
  }
  const cableMa = options.cableMa;
  return { fixed: cableMa === undefined ? fixed : fixed.map((r) => ({ ...r, currentMa: Math.min(r.currentMa, cableMa) })), avs, sprPdpW };
}

export function checkPowerRules(pdos: readonly SourcePdo[], pdpW: number, options: { epr?: boolean; cableMa?: number } = {}): Finding[] {
  if (pdpW <= 0) return [];
  const rules = powerRulesFor(pdpW, options);
  const findings: Finding[] = [];
  const who = `a ${pdpW} W source`;
  for (const required of rules.fixed) {
    const index = pdos.findIndex((p) => !isPadding(p) && p.kind === 'fixed' && p.voltageMv === required.voltageMv);
    const volts = required.voltageMv / 1_000;
    const amps = required.currentMa / 1_000;
    const offer = pdos[index];
    if (offer?.kind !== 'fixed') {
      findings.push(makeFinding('caps.power-rules-missing', `The Power Rules require ${who} to offer ${volts} V at ${amps} A, and no ${volts} V fixed supply is offered.`));
    } else if (offer.maxCurrentMa < required.currentMa) {
      findings.push(
        makeFinding('caps.power-rules-current', `${volts} V is offered at ${offer.maxCurrentMa / 1_000} A; the Power Rules require ${who} to offer it at ${amps} A.`, { object: index + 1 }),
      );
    }
  }
  if (rules.avs && !pdos.some((p) => p.kind === 'epr-avs')) {
    const { minVoltageMv, maxVoltageMv } = rules.avs;
    findings.push(
      makeFinding('caps.power-rules-missing', `The Power Rules require ${who} in EPR to offer an adjustable supply from ${minVoltageMv / 1_000} V to ${maxVoltageMv / 1_000} V, and none is offered.`),
    );
  }
  return findings;
}
