/**
 * All capability checks of one Source_Capabilities (or EPR_Source_Capabilities) object list:
 * structure, Power Rules at the declared or inferred PDP, programmable ranges, cable current and
 * the printed rating.
 */
import type { Finding } from '../core/finding.ts';
import type { SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { checkCableCurrent } from './cable-current.ts';
import { checkStructure } from './check-structure.ts';
import { inferPdpW } from './infer-pdp.ts';
import { checkLabel } from './label.ts';
import { checkPowerRules } from './power-rules.ts';
import { checkProgrammableRanges } from './programmable-ranges.ts';

export interface CheckCapsOptions {
  /** Declared PDP in W (from the rating or Source_Capabilities_Extended); inferred when absent. */
  pdpW?: number;
  /** The cable's current rating in mA; unknown when absent. */
  cableMa?: number;
  /** The cable's e-marker says EPR Mode Capable (unknown when absent). */
  cableEpr?: boolean;
  /** A printed rating to compare with the offers. */
  label?: string;
  /** The objects are those of EPR_Source_Capabilities (SPR in 1–7, EPR from 8). */
  epr?: boolean;
}

export interface CapsReport {
  pdpW: number;
  pdpInferred: boolean;
  findings: Finding[];
}

export function checkCaps(pdos: readonly SourcePdo[], options: CheckCapsOptions = {}): CapsReport {
  const pdpInferred = options.pdpW === undefined;
  const pdpW = options.pdpW ?? inferPdpW(pdos);
  const structure = checkStructure(pdos, { epr: options.epr });
  // With nothing offered only the Power Rules still have something to say (what is missing).
  if (structure.some((f) => f.rule === 'caps.empty')) return { pdpW, pdpInferred, findings: [...structure, ...checkPowerRules(pdos, pdpW, options)] };
  const findings = [
    ...structure,
    ...checkPowerRules(pdos, pdpW, { epr: options.epr, cableMa: options.cableMa }),
    ...checkProgrammableRanges(pdos, pdpW, { epr: options.epr }),
    ...checkCableCurrent(pdos, options.cableMa, options.cableEpr),
  ];
  if (pdpInferred) {
    findings.push(makeFinding('caps.pdp-inferred', `No PDP was declared, so it was taken as ${pdpW} W, the power of the strongest fixed offer; the Power Rules were checked at that PDP.`));
  }
  if (options.label !== undefined && options.label.trim() !== '') findings.push(...checkLabel(pdos, options.label, pdpW));
  return { pdpW, pdpInferred, findings };
}
