/**
 * Offers above 3 A: a sink can draw more than 3 A only through a 5 A electronically marked cable.
 * Source: USB Type-C R2.3 §4.9 Electronically Marked Cables and §3 (every cable carries 3 A);
 * USB PD R3.1 V1.8 §4.4 Cable Type Detection — from memory.
 */
import type { Finding } from '../core/finding.ts';
import type { SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { DEFAULT_CABLE_MA, describePdo, EPR_CABLE_MA, isPadding, offerCurrentMa, offerMaxPowerMw } from './pdo-facts.ts';

/** `cableMa` undefined: the cable is not known; 5000 or more: quiet. */
export function checkCableCurrent(pdos: readonly SourcePdo[], cableMa?: number): Finding[] {
  if (cableMa !== undefined && cableMa >= EPR_CABLE_MA) return [];
  const limitMa = Math.min(cableMa ?? DEFAULT_CABLE_MA, DEFAULT_CABLE_MA);
  const findings: Finding[] = [];
  pdos.forEach((pdo, i) => {
    if (isPadding(pdo)) return;
    const currentMa = offerCurrentMa(pdo);
    if (currentMa === undefined || currentMa <= DEFAULT_CABLE_MA) return;
    const throughWatts = offerMaxPowerMw(pdo, limitMa) / 1_000;
    const cable = cableMa === undefined ? 'an ordinary 3 A cable' : `the ${cableMa / 1_000} A cable given`;
    findings.push(
      makeFinding(
        'caps.cable-current',
        `Object ${i + 1} (${describePdo(pdo)}) offers more than 3 A, which a sink can take only over a 5 A cable; over ${cable} it gets at most ${limitMa / 1_000} A (${throughWatts} W).`,
        { object: i + 1 },
      ),
    );
  });
  return findings;
}
