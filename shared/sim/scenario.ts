/**
 * The negotiation scenario of docs/vector.md as a zod schema, with defaults.
 * Extensions beyond vector.md (all optional): `source.behaviour.*` knobs, `sink.load`,
 * `sink.behaviour`, and a fault's `count`.
 */
import { z } from 'zod';
import { fail, type Result } from '../core/result.ts';
import { sinkPolicySchema } from '../rules/sink-policy.ts';
import { resolveCaps } from './caps.ts';

const revision = z.enum(['2.0', '3.0']);
const ms = z.number().int().nonnegative();

const capsSchema = z.union([
  z.object({ pdos: z.array(z.string()).min(1).max(7) }).strict(),
  z.object({ hex: z.string().min(1) }).strict(),
]);

export const sourceBehaviourSchema = z.object({
  /** Fixed SourceCapabilityTimer instead of jitter within tTypeCSendSourceCap (a value outside 100–200 ms is itself a fault). */
  capsIntervalMs: z.number().int().min(1).max(10_000).optional(),
  /** Fixed delay from vSafe5V to the first Source_Capabilities instead of jitter within tFirstSourceCap. */
  firstCapsDelayMs: ms.max(10_000).optional(),
  /** Fixed delay from Accept to the start of the transition instead of jitter within tSrcTransition. */
  transitionDelayMs: ms.max(10_000).optional(),
  /** VBUS slew rate during a transition; USB PD R3.2 V1.1 §7.1.4 vSrcSlewPos allows at most 30 mV/µs. */
  slewMvPerMs: z.number().int().min(10).max(30_000).default(1_000),
  /** Type-C current advertisement (USB Type-C R2.3 §4.6.2.1). */
  rp: z.enum(['default', '1.5A', '3.0A']).default('3.0A'),
});

export const faultSchema = z
  .object({
    kind: z.enum(['drop', 'corrupt', 'delay', 'reject', 'no-ps-rdy', 'silent']),
    from: z.enum(['source', 'sink']).optional(),
    messageType: z.string().min(1).optional(),
    nth: z.number().int().min(1).optional(),
    /** Extension: how many matching messages from the nth on (default 1 with `nth`, every one without). */
    count: z.number().int().min(1).optional(),
    atMs: ms.optional(),
    delayMs: ms.max(60_000).optional(),
  })
  .strict()
  .refine((fault) => fault.kind !== 'delay' || fault.delayMs !== undefined, { message: 'a delay fault needs delayMs', path: ['delayMs'] })
  .refine((fault) => fault.kind !== 'silent' || fault.from !== undefined, { message: 'a silent fault needs from (source or sink)', path: ['from'] });

export const scenarioSchema = z
  .object({
    source: z
      .object({
        caps: capsSchema,
        specRevision: revision.default('3.0'),
        behaviour: sourceBehaviourSchema.prefault({}),
      })
      .strict(),
    sink: z
      .object({
        specRevision: revision.default('3.0'),
        policy: sinkPolicySchema.default({ kind: 'max-power' }),
        changes: z.array(z.object({ atMs: ms, policy: sinkPolicySchema }).strict()).default([]),
        load: z
          .object({
            /** What the sink draws under a contract (default: the contract's operating current). */
            currentMa: z.number().int().min(0).max(10_000).optional(),
            /** Later changes of the draw, e.g. to push a programmable supply into current limit. */
            steps: z.array(z.object({ atMs: ms, currentMa: z.number().int().min(0).max(10_000) }).strict()).default([]),
          })
          .strict()
          .prefault({}),
        behaviour: z
          .object({
            /** Fixed keep-alive period of a programmable contract instead of jitter below tPPSRequest. */
            ppsRequestIntervalMs: z.number().int().min(1).max(60_000).optional(),
          })
          .strict()
          .prefault({}),
      })
      .strict()
      .prefault({}),
    cable: z
      .object({
        currentRatingMa: z.number().int().min(500).max(5_000).default(3_000),
        resistanceMohm: z.number().int().min(0).max(2_000).default(100),
      })
      .strict()
      .prefault({}),
    faults: z.array(faultSchema).default([]),
    durationMs: z.number().int().min(1).max(600_000).default(5_000),
    seed: z.number().int().default(1),
  })
  .strict()
  .superRefine((scenario, context) => {
    const caps = resolveCaps(scenario.source.caps);
    if (!caps.ok) context.addIssue({ code: 'custom', path: ['source', 'caps'], message: caps.error.message });
  });

export type Scenario = z.output<typeof scenarioSchema>;
export type ScenarioInput = z.input<typeof scenarioSchema>;
export type Fault = z.output<typeof faultSchema>;

/** Validates user input; errors read "field: message" (the first problem). */
export function parseScenario(input: unknown): Result<{ scenario: Scenario }> {
  const parsed = scenarioSchema.safeParse(input);
  if (parsed.success) return { ok: true, scenario: parsed.data };
  const issue = parsed.error.issues[0];
  const field = issue && issue.path.length > 0 ? issue.path.join('.') : 'scenario';
  return fail('scenario.invalid', `${field}: ${issue?.message ?? 'invalid scenario'}`);
}
