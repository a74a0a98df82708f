/**
 * Structural checks of a Source_Capabilities (or EPR_Source_Capabilities) object list:
 * vSafe5V first, the required order, one fixed supply per voltage, at most seven SPR objects,
 * EPR objects only from position 8 of EPR_Source_Capabilities.
 *
 * Source: USB PD R3.1 V1.8 §6.4.1 Capabilities Message (order of PDOs), §6.5.15.1
 * EPR_Source_Capabilities; R3.2 V1.1 §6.4.1 (SPR AVS APDO) — from memory.
 */
import type { Finding } from '../core/finding.ts';
import type { SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { describePdo, FIRST_EPR_POSITION, isEprPdo, isPadding, MAX_SPR_OBJECTS } from './pdo-facts.ts';

/** Order rank by kind within the SPR (or EPR) part: fixed, battery, variable, SPR AVS, PPS, EPR AVS. */
const KIND_RANK: Record<SourcePdo['kind'], number> = { fixed: 0, battery: 1, variable: 2, 'spr-avs': 3, pps: 4, 'epr-avs': 5 };

function sortKeyMv(pdo: SourcePdo): number {
  switch (pdo.kind) {
    case 'fixed':
      return pdo.voltageMv;
    case 'battery':
    case 'variable':
      return pdo.minVoltageMv; // by rising minimum voltage
    case 'pps':
    case 'epr-avs':
      return pdo.maxVoltageMv; // by rising maximum voltage
    case 'spr-avs':
      return 0;
  }
}

interface Positioned {
  pdo: SourcePdo;
  position: number;
}

export function checkStructure(pdos: readonly SourcePdo[], options: { epr?: boolean } = {}): Finding[] {
  const findings: Finding[] = [];
  const all: Positioned[] = pdos.map((pdo, i) => ({ pdo, position: i + 1 }));
  const real = all.filter((p) => !isPadding(p.pdo));
  if (real.length === 0) return [makeFinding('caps.empty', 'The message offers no power data objects at all.')];

  const first = pdos[0];
  if (first?.kind !== 'fixed' || first.voltageMv !== 5_000) {
    const what = first ? describePdo(first) : 'nothing';
    findings.push(makeFinding('caps.first-not-vsafe5v', `Object 1 is ${what}, but the first offer must be the 5 V fixed supply.`, { object: 1 }));
  }

  const spr = options.epr ? all.slice(0, MAX_SPR_OBJECTS).filter((p) => !isPadding(p.pdo)) : real;
  const eprPart = options.epr ? all.slice(MAX_SPR_OBJECTS).filter((p) => !isPadding(p.pdo)) : [];

  if (!options.epr && real.length > MAX_SPR_OBJECTS) {
    findings.push(makeFinding('caps.too-many-objects', `The message carries ${real.length} objects; Source_Capabilities holds at most ${MAX_SPR_OBJECTS}.`, { object: MAX_SPR_OBJECTS + 1 }));
  }

  for (const p of spr) {
    if (isEprPdo(p.pdo)) {
      const where = options.epr
        ? `position ${p.position}, but EPR offers start at position ${FIRST_EPR_POSITION}`
        : 'an SPR Source_Capabilities message; EPR offers belong in EPR_Source_Capabilities from position 8';
      findings.push(makeFinding('caps.epr-position', `Object ${p.position} (${describePdo(p.pdo)}) is an EPR offer in ${where}.`, { object: p.position }));
    }
  }
  for (const p of eprPart) {
    if (!isEprPdo(p.pdo)) {
      findings.push(
        makeFinding('caps.epr-position', `Object ${p.position} (${describePdo(p.pdo)}) is an SPR offer after position ${MAX_SPR_OBJECTS}, where only EPR offers belong.`, { object: p.position }),
      );
    }
  }

  findings.push(...checkOrder(spr));
  findings.push(...checkOrder(eprPart));
  findings.push(...checkDuplicates(real));
  return findings;
}

/** One finding at the first object that breaks the order (one is enough to say "sort them"). */
function checkOrder(part: Positioned[]): Finding[] {
  for (let i = 1; i < part.length; i++) {
    const prev = part[i - 1]!;
    const cur = part[i]!;
    const rankPrev = KIND_RANK[prev.pdo.kind];
    const rankCur = KIND_RANK[cur.pdo.kind];
    const outOfOrder = rankCur < rankPrev || (rankCur === rankPrev && sortKeyMv(cur.pdo) < sortKeyMv(prev.pdo));
    if (outOfOrder) {
      return [
        makeFinding(
          'caps.order',
          `Object ${cur.position} (${describePdo(cur.pdo)}) comes after object ${prev.position} (${describePdo(prev.pdo)}); fixed supplies go first by rising voltage, then battery and variable supplies, then SPR AVS, then PPS by rising maximum voltage.`,
          { object: cur.position },
        ),
      ];
    }
  }
  return [];
}

function checkDuplicates(real: Positioned[]): Finding[] {
  const seen = new Map<number, number>();
  const findings: Finding[] = [];
  for (const p of real) {
    if (p.pdo.kind !== 'fixed') continue;
    const earlier = seen.get(p.pdo.voltageMv);
    if (earlier !== undefined) {
      findings.push(
        makeFinding('caps.duplicate', `Objects ${earlier} and ${p.position} are both fixed ${p.pdo.voltageMv / 1_000} V supplies; each fixed voltage may be offered once.`, { object: p.position }),
      );
    } else seen.set(p.pdo.voltageMv, p.position);
  }
  return findings;
}
