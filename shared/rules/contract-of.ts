/**
 * The explicit contract a Request makes with the offer it names (docs/cli.md
 * `Contract`). The RDO is read by the type of the referenced PDO (USB PD R3.1 V1.8 §6.4.2: the
 * RDO does not carry its own type — from memory), so an RDO decoded without the offers is re-read.
 *
 * Variable and battery supplies are given at their minimum voltage: the power the offer is sure to
 * deliver, and for a battery the highest current it can mean.
 */
import type { Contract } from '../core/contract.ts';
import { decodeRdo, encodeRdo } from '../pd/index.ts';
import type { Rdo, SourcePdo } from '../pd/types.ts';
import { powerMw } from './pdo-facts.ts';

/** The RDO's reading by the referenced PDO's type. */
export function typedRdo(rdo: Rdo, pdo: SourcePdo): Rdo {
  const wanted = pdo.kind === 'pps' ? 'rdo-pps' : pdo.kind === 'epr-avs' || pdo.kind === 'spr-avs' ? 'rdo-avs' : pdo.kind === 'battery' ? 'rdo-battery' : `rdo-${pdo.kind}`;
  if (rdo.kind === wanted) return rdo;
  return decodeRdo(rawOf(rdo), pdo);
}

/** The RDO's 32-bit value: its `raw`, or (built in code without one) its fields encoded. */
function rawOf(rdo: Rdo): number {
  if (/^(0x)?[0-9a-f]{1,8}$/i.test(rdo.raw)) return Number.parseInt(rdo.raw, 16) >>> 0;
  try {
    return encodeRdo(rdo);
  } catch {
    return 0; // fields out of range: read as position 0, which checkRequest reports
  }
}

export function contractOf(rdo: Rdo, pdo: SourcePdo): Contract {
  const r = typedRdo(rdo, pdo);
  const objectPosition = r.objectPosition;
  switch (r.kind) {
    case 'rdo-pps':
    case 'rdo-avs':
      return { kind: r.kind === 'rdo-pps' ? 'pps' : 'avs', objectPosition, voltageMv: r.outputVoltageMv, currentMa: r.operatingCurrentMa, powerMw: powerMw(r.outputVoltageMv, r.operatingCurrentMa) };
    case 'rdo-battery': {
      const voltageMv = pdo.kind === 'battery' ? pdo.minVoltageMv : 0;
      const currentMa = voltageMv > 0 ? Math.floor((r.operatingPowerMw * 1_000) / voltageMv) : 0;
      return { kind: 'battery', objectPosition, voltageMv, currentMa, powerMw: r.operatingPowerMw };
    }
    default: {
      const voltageMv = pdo.kind === 'fixed' ? pdo.voltageMv : pdo.kind === 'variable' ? pdo.minVoltageMv : 0;
      return { kind: pdo.kind === 'variable' ? 'variable' : 'fixed', objectPosition, voltageMv, currentMa: r.operatingCurrentMa, powerMw: powerMw(voltageMv, r.operatingCurrentMa) };
    }
  }
}
