/**
 * The negotiation scenario of docs/vector.md as a zod schema, with defaults ("Scenario" and
 * "Scenario, continued": EPR offers, the sink's EPR PDP, the cable's e-marker, actions, swaps).
 * Extensions beyond vector.md (all optional): `source.behaviour.*` knobs, `sink.load`,
 * `sink.behaviour` (with its own `swapAnswer`), and a fault's `count`.
 */
import { z } from 'zod';
import { fail, type Result } from '../core/result.ts';
import { timersPd3, type TimerName } from '../core/timers.ts';
import { sinkPolicySchema } from '../rules/sink-policy.ts';
import { resolveCaps } from './caps.ts';
import { zodMessage } from '../core/zod-message.ts';

const TIMER_NAMES = Object.keys(timersPd3) as [TimerName, ...TimerName[]];

const revision = z.enum(['2.0', '3.0']);
const ms = z.number().int().nonnegative();

const capsSchema = z.union([z.object({ pdos: z.array(z.string()).min(1).max(7) }).strict(), z.object({ hex: z.string().min(1) }).strict()]);
/** EPR objects, from object position 8 (USB PD R3.2 V1.1 §6.5.15.1; at most 4, positions 8–11, from memory). */
const eprCapsSchema = z.object({ pdos: z.array(z.string()).min(1).max(4) }).strict();
const pdoListSchema = z.object({ pdos: z.array(z.string()).min(1).max(7) }).strict();

/** How a port answers PR_Swap, DR_Swap and VCONN_Swap (vector.md "Scenario, continued"). */
export const swapAnswerSchema = z.enum(['accept', 'reject', 'wait', 'not_supported']);

export const actionNames = [
  'get_source_cap',
  'get_sink_cap',
  'get_source_cap_extended',
  'get_status',
  'get_pps_status',
  'pr_swap',
  'dr_swap',
  'vconn_swap',
  'soft_reset',
  'hard_reset',
  'epr_exit',
] as const;
export const actionSchema = z.object({ atMs: ms, by: z.enum(['source', 'sink']), action: z.enum(actionNames) }).strict();
export type ActionName = (typeof actionNames)[number];

/** The cable plug's e-marker (Passive Cable VDO): USB PD R3.2 V1.1 §6.4.4.3.1.6. */
export const eMarkerSchema = z
  .object({
    currentMa: z.union([z.literal(3_000), z.literal(5_000)]),
    maxVoltageMv: z.union([z.literal(20_000), z.literal(30_000), z.literal(40_000), z.literal(50_000)]),
    eprCapable: z.boolean().default(false),
  })
  .strict();

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
  /** How the source answers PR_Swap, DR_Swap and VCONN_Swap. */
  swapAnswer: swapAnswerSchema.default('reject'),
});

export const faultSchema = z
  .object({
    kind: z.enum(['drop', 'corrupt', 'delay', 'reject', 'no-ps-rdy', 'silent', 'wait']),
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
        eprCaps: eprCapsSchema.optional(),
        specRevision: revision.default('3.0'),
        behaviour: sourceBehaviourSchema.prefault({}),
        /** After a PR_Swap the former source requests with this policy (default vSafe5V at the offered current). */
        swapPolicy: sinkPolicySchema.optional(),
      })
      .strict(),
    sink: z
      .object({
        specRevision: revision.default('3.0'),
        policy: sinkPolicySchema.default({ kind: 'max-power' }),
        /** EPR capable with this operational PDP (W). */
        epr: z
          .object({ pdpW: z.number().int().min(1).max(240) })
          .strict()
          .optional(),
        /** The sink's Sink_Capabilities (default: from its policy, vSafe5V first). */
        caps: pdoListSchema.optional(),
        /** What the former sink offers after a PR_Swap (default one fixed 5 V 1.5 A object). */
        swapCaps: pdoListSchema.optional(),
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
            /** How the sink answers PR_Swap, DR_Swap and VCONN_Swap. */
            swapAnswer: swapAnswerSchema.default('reject'),
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
        eMarker: eMarkerSchema.optional(),
      })
      .strict()
      .prefault({}),
    actions: z.array(actionSchema).max(1_000).default([]),
    faults: z.array(faultSchema).default([]),
    durationMs: z.number().int().min(1).max(600_000).default(5_000),
    seed: z.number().int().default(1),
    /**
     * Extension: timers held at one end of their range instead of drawn with the seed (a fault
     * sweep's timer edges), e.g. `{"tPSTransition": "max"}`. Names are those of the timer table.
     */
    timers: z.partialRecord(z.enum(TIMER_NAMES), z.enum(['min', 'max'])).optional(),
  })
  .strict()
  .superRefine((scenario, context) => {
    const caps = resolveCaps(scenario.source.caps);
    if (!caps.ok) {
      context.addIssue({ code: 'custom', path: ['source', 'caps'], message: caps.error.message });
      return;
    }
    // USB PD R2.0 has no Augmented PDOs (R3.2 V1.1 §6.4.1: APDOs are R3.x only).
    const apdo = caps.pdos.findIndex((pdo) => pdo.kind === 'pps' || pdo.kind === 'spr-avs' || pdo.kind === 'epr-avs');
    if (scenario.source.specRevision === '2.0' && apdo >= 0) {
      context.addIssue({
        code: 'custom',
        path: ['source', 'caps'],
        message: `a PD 2.0 source cannot offer programmable (augmented) objects, and object ${apdo + 1} is one; set specRevision "3.0" or remove it`,
      });
    }
    if (scenario.source.eprCaps) {
      if (scenario.source.specRevision === '2.0') context.addIssue({ code: 'custom', path: ['source', 'eprCaps'], message: 'EPR needs a PD 3.x source: set specRevision "3.0"' });
      const epr = resolveCaps(scenario.source.eprCaps);
      if (!epr.ok) context.addIssue({ code: 'custom', path: ['source', 'eprCaps'], message: epr.error.message });
    }
    if (scenario.sink.epr && scenario.sink.specRevision === '2.0') context.addIssue({ code: 'custom', path: ['sink', 'epr'], message: 'EPR needs a PD 3.x sink: set specRevision "3.0"' });
    for (const key of ['caps', 'swapCaps'] as const) {
      const list = scenario.sink[key];
      const bad = list?.pdos.findIndex((text) => !/^(0x)?[0-9a-f]{1,8}$/i.test(text.trim())) ?? -1;
      if (bad >= 0) context.addIssue({ code: 'custom', path: ['sink', key, 'pdos', bad], message: `"${list!.pdos[bad]}" is not a 32-bit hex word` });
    }
  });

export type Scenario = z.output<typeof scenarioSchema>;
export type ScenarioInput = z.input<typeof scenarioSchema>;
export type Fault = z.output<typeof faultSchema>;

/** Validates user input; errors read "field: message" (the first problem). */
export function parseScenario(input: unknown): Result<{ scenario: Scenario }> {
  const parsed = scenarioSchema.safeParse(input);
  if (parsed.success) return { ok: true, scenario: parsed.data };
  return fail('scenario.invalid', zodMessage(parsed.error, { where: 'scenario', limit: 1 }));
}
