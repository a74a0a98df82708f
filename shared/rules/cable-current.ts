/**
 * Offers above 3 A: a sink can draw more than 3 A only through a 5 A electronically marked cable.
 * Source: USB Type-C R2.3 §4.9 Electronically Marked Cables and §3 (every cable carries 3 A);
 * USB PD R3.1 V1.8 §4.4 Cable Type Detection — from memory.
 * EPR offers are another matter: without an EPR-capable 50 V 5 A cable the sink cannot enter EPR
 * mode at all (USB PD R3.2 V1.1 §8.3.3.26, the source checks the e-marker before Enter Succeeded —
 * from memory), so they get `caps.cable-epr`, never "at most 3 A".
 */
import type { Finding } from '../core/finding.ts';
import type { SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { DEFAULT_CABLE_MA, describePdo, EPR_CABLE_MA, isEprPdo, isPadding, offerCurrentMa, offerMaxPowerMw } from './pdo-facts.ts';

/**
 * `cableMa` undefined: the cable is not known; 5000 or more: quiet about current. `cableEpr`: the
 * cable's e-marker says EPR Mode Capable (a 5 A cable given without saying is taken as EPR capable).
 */
export function checkCableCurrent(pdos: readonly SourcePdo[], cableMa?: number, cableEpr?: boolean): Finding[] {
  const findings: Finding[] = [];
  const eprReady = cableMa !== undefined && cableMa >= EPR_CABLE_MA && cableEpr !== false;
  pdos.forEach((pdo, i) => {
    if (isPadding(pdo) || eprReady || !isEprPdo(pdo)) return;
    const cable = cableMa === undefined ? 'a cable without an EPR-capable e-marker' : `the ${cableMa / 1_000} A cable given${cableMa >= EPR_CABLE_MA ? ', which is not EPR capable' : ''}`;
    findings.push(
      makeFinding(
        'caps.cable-epr',
        `Object ${i + 1} (${describePdo(pdo)}) is an EPR offer, which a sink can reach only in EPR mode over an EPR-capable 50 V, 5 A e-marked cable; over ${cable} the sink cannot enter EPR mode and stays on the SPR offers.`,
        { object: i + 1 },
      ),
    );
  });
  if (cableMa !== undefined && cableMa >= EPR_CABLE_MA) return findings;
  const limitMa = Math.min(cableMa ?? DEFAULT_CABLE_MA, DEFAULT_CABLE_MA);
  pdos.forEach((pdo, i) => {
    if (isPadding(pdo) || isEprPdo(pdo)) return;
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
