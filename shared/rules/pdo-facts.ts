/**
 * Small facts about source PDOs the checks and the sink policies share: what counts as an EPR
 * offer, an empty padding object, and the power an offer guarantees.
 */
import type { SourcePdo } from '../pd/types.ts';

/** The highest SPR fixed voltage; fixed supplies above it are EPR (USB PD R3.1 V1.8 §6.4.1.2, from memory). */
export const SPR_MAX_VOLTAGE_MV = 20_000;
/** Object positions 1–7 hold SPR offers; EPR offers start at 8 (USB PD R3.1 V1.8 §6.5.15.1, from memory). */
export const FIRST_EPR_POSITION = 8;
export const MAX_SPR_OBJECTS = 7;
/** Every USB Type-C cable carries 3 A; more needs a 5 A electronically marked cable (USB Type-C R2.3 §4.9, from memory). */
export const DEFAULT_CABLE_MA = 3_000;
export const EPR_CABLE_MA = 5_000;

/** An all-zero object: the padding EPR_Source_Capabilities puts in unused SPR positions. */
export function isPadding(pdo: SourcePdo): boolean {
  return Number.parseInt(pdo.raw, 16) === 0;
}

export function isEprPdo(pdo: SourcePdo): boolean {
  if (pdo.kind === 'epr-avs') return true;
  if (pdo.kind === 'fixed' || pdo.kind === 'variable' || pdo.kind === 'battery') {
    return (pdo.kind === 'fixed' ? pdo.voltageMv : pdo.maxVoltageMv) > SPR_MAX_VOLTAGE_MV;
  }
  return false;
}

/** The highest current an offer allows, if it states one. */
export function offerCurrentMa(pdo: SourcePdo): number | undefined {
  switch (pdo.kind) {
    case 'fixed':
    case 'variable':
    case 'pps':
      return pdo.maxCurrentMa;
    case 'spr-avs':
      return Math.max(pdo.maxCurrent15vMa, pdo.maxCurrent20vMa);
    default:
      return undefined;
  }
}

/** The lowest and highest voltage of an offer, in mV (spr-avs: 9–20 V, USB PD R3.2 V1.1 §10.2.3, from memory). */
export function voltageRangeMv(pdo: SourcePdo): { minMv: number; maxMv: number } {
  switch (pdo.kind) {
    case 'fixed':
      return { minMv: pdo.voltageMv, maxMv: pdo.voltageMv };
    case 'spr-avs':
      return { minMv: 9_000, maxMv: pdo.maxCurrent20vMa > 0 ? 20_000 : 15_000 };
    default:
      return { minMv: pdo.minVoltageMv, maxMv: pdo.maxVoltageMv };
  }
}

/** mV × mA → mW, rounded down. */
export function powerMw(voltageMv: number, currentMa: number): number {
  return Math.floor((voltageMv * currentMa) / 1_000);
}

/** The power an offer can deliver at most (through a cable of `cableMa`), in mW. */
export function offerMaxPowerMw(pdo: SourcePdo, cableMa = Number.POSITIVE_INFINITY): number {
  switch (pdo.kind) {
    case 'fixed':
      return powerMw(pdo.voltageMv, Math.min(pdo.maxCurrentMa, cableMa));
    case 'variable':
    case 'pps':
      return powerMw(pdo.maxVoltageMv, Math.min(pdo.maxCurrentMa, cableMa));
    case 'battery':
      return Math.min(pdo.maxPowerMw, powerMw(pdo.maxVoltageMv, cableMa));
    case 'epr-avs':
      return Math.min(pdo.pdpW * 1_000, powerMw(pdo.maxVoltageMv, cableMa));
    case 'spr-avs':
      return Math.max(powerMw(15_000, Math.min(pdo.maxCurrent15vMa, cableMa)), powerMw(20_000, Math.min(pdo.maxCurrent20vMa, cableMa)));
  }
}

export function describePdo(pdo: SourcePdo): string {
  const v = (mv: number) => `${trim(mv / 1_000)} V`;
  const range = (minMv: number, maxMv: number) => `${trim(minMv / 1_000)}–${trim(maxMv / 1_000)} V`;
  const a = (ma: number) => `${trim(ma / 1_000)} A`;
  switch (pdo.kind) {
    case 'fixed':
      return `fixed ${v(pdo.voltageMv)} ${a(pdo.maxCurrentMa)}`;
    case 'variable':
      return `variable ${range(pdo.minVoltageMv, pdo.maxVoltageMv)} ${a(pdo.maxCurrentMa)}`;
    case 'battery':
      return `battery ${range(pdo.minVoltageMv, pdo.maxVoltageMv)} ${trim(pdo.maxPowerMw / 1_000)} W`;
    case 'pps':
      return `PPS ${range(pdo.minVoltageMv, pdo.maxVoltageMv)} ${a(pdo.maxCurrentMa)}`;
    case 'epr-avs':
      return `EPR AVS ${range(pdo.minVoltageMv, pdo.maxVoltageMv)} ${pdo.pdpW} W`;
    case 'spr-avs':
      return `SPR AVS 15 V ${a(pdo.maxCurrent15vMa)}, 20 V ${a(pdo.maxCurrent20vMa)}`;
  }
}

function trim(value: number): string {
  return String(Math.round(value * 1_000) / 1_000);
}
