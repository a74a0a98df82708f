/**
 * Sink policies (docs/vector.md "Sink policies"): how a simulated or computed sink
 * picks its Request. One zod schema serves vectors, scenarios, the CLI's `request --sink` and the UI.
 *
 * Beyond the contract's fields, every policy may carry the sink's RDO flags (all default false);
 * EPR Mode Capable is also set by `chooseRequest` itself when it picks an EPR offer.
 */
import { z } from 'zod';
import type { Contract } from '../core/contract.ts';
import type { Rdo } from '../pd/types.ts';

const millivolts = z.number().int().min(0).max(60_000);
const milliamps = z.number().int().min(0).max(10_000);

const rdoFlags = {
  usbCommunicationsCapable: z.boolean().optional(),
  noUsbSuspend: z.boolean().optional(),
  unchunkedExtendedMessages: z.boolean().optional(),
  eprModeCapable: z.boolean().optional(),
};

export const maxPowerPolicySchema = z.object({ kind: z.literal('max-power'), ...rdoFlags }).strict();

export const fixedPolicySchema = z.object({ kind: z.literal('fixed'), voltageMv: millivolts, currentMa: milliamps, ...rdoFlags }).strict();

export const ppsPolicySchema = z.object({ kind: z.literal('pps'), voltageMv: millivolts, currentMa: milliamps, ...rdoFlags }).strict();

/** An adjustable-voltage offer (SPR AVS or EPR AVS): voltage in 100 mV steps, current in 50 mA steps (vector.md). */
export const avsPolicySchema = z.object({ kind: z.literal('avs'), voltageMv: millivolts, currentMa: milliamps, ...rdoFlags }).strict();

export const rangePolicySchema = z
  .object({
    kind: z.literal('range'),
    minVoltageMv: millivolts,
    maxVoltageMv: millivolts,
    powerMw: z.number().int().min(0).max(240_000),
    ...rdoFlags,
  })
  .strict()
  .refine((p) => p.minVoltageMv <= p.maxVoltageMv, { message: 'minVoltageMv must not exceed maxVoltageMv', path: ['maxVoltageMv'] });

export const sinkPolicySchema = z.discriminatedUnion('kind', [maxPowerPolicySchema, fixedPolicySchema, ppsPolicySchema, avsPolicySchema, rangePolicySchema]);

export type SinkPolicy = z.infer<typeof sinkPolicySchema>;
export type SinkPolicyKind = SinkPolicy['kind'];

export interface ChooseRequestOptions {
  /** The cable's current rating; default 3000 (every USB Type-C cable carries 3 A). */
  cableMa?: number;
  /** Consider EPR offers (object positions 8 and up, fixed above 20 V, EPR AVS); default false. */
  epr?: boolean;
}

export interface ChosenRequest {
  /** The 32-bit RDO as sent. */
  rdoRaw: number;
  rdo: Rdo;
  objectPosition: number;
  capabilityMismatch: boolean;
  contract: Contract;
}

/** The signature `chooseRequest` (./choose-request.ts) implements. */
export type ChooseRequest = (pdos: readonly import('../pd/types.ts').SourcePdo[], policy: SinkPolicy, options?: ChooseRequestOptions) => ChosenRequest;
