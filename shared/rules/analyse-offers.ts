/**
 * One call for the Offers page (run in workers/rules.worker.ts): builds the PDOs from the form's
 * offers, runs every capability check, and computes the contract a sink policy takes over a 3 A
 * and a 5 A cable. `readOffers` turns a pasted message or a list of PDO words into form offers.
 *
 * In EPR mode the form lists SPR offers then EPR offers; empty objects are put in before the first
 * EPR offer so it sits at position 8, as EPR_Source_Capabilities places it (USB PD R3.1 V1.8
 * §6.5.15.1, from memory).
 */
import type { Contract } from '../core/contract.ts';
import type { Finding } from '../core/finding.ts';
import { fail, type Result } from '../core/result.ts';
import type { SourcePdo } from '../pd/types.ts';
import { checkCaps, type CapsReport } from './check-caps.ts';
import { chooseRequest } from './choose-request.ts';
import { buildOffers, offerInputOf, type OfferInput } from './offer-input.ts';
import { paddingPdo } from './pdo-builders.ts';
import { FIRST_EPR_POSITION, isEprPdo, isPadding } from './pdo-facts.ts';
import { readCapsHex, readPdoList } from './read-caps.ts';
import { requestMessageHex } from './request-message.ts';
import { sinkPolicySchema } from './sink-policy.ts';
import { zodMessage } from '../core/zod-message.ts';

export interface AnalyseOffersInput {
  offers: OfferInput[];
  pdpW?: number;
  cableMa?: number;
  label?: string;
  epr?: boolean;
  /** A sink policy (vector.md); validated here. */
  policy?: unknown;
}

export interface CableContract {
  cableMa: number;
  rdo: string;
  hex: string;
  objectPosition: number;
  capabilityMismatch: boolean;
  contract: Contract;
}

export interface OffersAnalysis {
  pdos: SourcePdo[];
  report: CapsReport;
  contracts: CableContract[];
}

function placeEpr(pdos: SourcePdo[]): SourcePdo[] {
  const firstEpr = pdos.findIndex(isEprPdo);
  if (firstEpr === -1 || firstEpr >= FIRST_EPR_POSITION - 1) return pdos;
  return [...pdos.slice(0, firstEpr), ...Array.from({ length: FIRST_EPR_POSITION - 1 - firstEpr }, paddingPdo), ...pdos.slice(firstEpr)];
}

export function analyseOffers(input: AnalyseOffersInput): Result<OffersAnalysis> {
  const built = buildOffers(input.offers);
  if (!built.ok) return built;
  const pdos = input.epr ? placeEpr(built.pdos) : built.pdos;
  const report = checkCaps(pdos, { pdpW: input.pdpW, cableMa: input.cableMa, label: input.label, epr: input.epr });
  const contracts: CableContract[] = [];
  if (input.policy !== undefined) {
    const policy = sinkPolicySchema.safeParse(input.policy);
    if (!policy.success) {
      return fail('input.policy', zodMessage(policy.error, { prefix: 'policy', limit: 1 }));
    }
    for (const cableMa of [3_000, 5_000]) {
      const chosen = chooseRequest(pdos, policy.data, { cableMa, epr: input.epr });
      const pdo = pdos[chosen.objectPosition - 1];
      const message = pdo ? requestMessageHex(chosen.rdo, pdo) : undefined;
      contracts.push({
        cableMa,
        rdo: chosen.rdo.raw,
        hex: message?.ok ? message.hex : '',
        objectPosition: chosen.objectPosition,
        capabilityMismatch: chosen.capabilityMismatch,
        contract: chosen.contract,
      });
    }
  }
  return { ok: true, pdos, report, contracts };
}

export interface ReadOffers {
  offers: OfferInput[];
  epr: boolean;
  warnings: Finding[];
}

/** A pasted Source_Capabilities / EPR_Source_Capabilities message, or PDO words, as form offers. */
export function readOffers(input: { hex: string } | { pdos: readonly string[] }): Result<ReadOffers> {
  const read = 'hex' in input ? readCapsHex(input.hex, 'message') : readPdoList(input.pdos);
  if (!read.ok) return read;
  return { ok: true, offers: read.pdos.filter((p) => !isPadding(p)).map(offerInputOf), epr: read.epr, warnings: read.warnings };
}
