/**
 * The Bench form's values and their two-way mapping to a Scenario (vector.md). The form edits the
 * fields people change most; everything else a scenario may carry (sink load steps, behaviour
 * knobs, a fault's count, …) rides along in the `base` scenario, so a JSON edit the form cannot
 * show survives a round trip through the form.
 */
import { z } from 'zod';
import { buildOffers, offerInputOf, offerListSchema, type OfferInput } from '../../../../shared/rules/offer-input.ts';
import { sinkPolicySchema } from '../../../../shared/rules/sink-policy.ts';
import { resolveCaps } from '../../../../shared/sim/caps.ts';
import { actionSchema, faultSchema, scenarioSchema, type Scenario, type ScenarioInput } from '../../../../shared/sim/scenario.ts';

/** The cable's e-marker as one choice (vector.md `cable.eMarker`): none, or a Passive Cable VDO. */
export const eMarkerChoices = {
  none: null,
  '3a-20v': { currentMa: 3_000, maxVoltageMv: 20_000, eprCapable: false },
  '5a-20v': { currentMa: 5_000, maxVoltageMv: 20_000, eprCapable: false },
  '5a-50v-epr': { currentMa: 5_000, maxVoltageMv: 50_000, eprCapable: true },
} as const;
export type EMarkerChoice = keyof typeof eMarkerChoices;

function eMarkerChoiceOf(marker: { currentMa: number; maxVoltageMv: number; eprCapable: boolean } | undefined): EMarkerChoice {
  if (!marker) return 'none';
  if (marker.eprCapable && marker.currentMa === 5_000 && marker.maxVoltageMv === 50_000) return '5a-50v-epr';
  return marker.currentMa === 5_000 ? '5a-20v' : '3a-20v';
}
import { zodMessage } from '../../../../shared/core/zod-message.ts';
import { fail, type Result } from '../../../../shared/core/result.ts';

const revisionSchema = z.enum(['2.0', '3.0']);
const msSchema = z.number({ error: 'enter a number' }).int('must be a whole number of ms').min(0, 'must be at least 0 ms');

export const benchFormSchema = z.object({
  offers: offerListSchema.max(7, 'a Source_Capabilities message carries at most 7 offers'),
  /** EPR offers from object position 8 (empty: an SPR-only source). */
  eprOffers: z.array(offerListSchema.element).max(4, 'at most 4 EPR offers (positions 8–11)'),
  /** Empty: the sink is not EPR capable. */
  sinkEprPdpW: z.number({ error: 'enter a number' }).int().min(1, 'must be at least 1 W').max(240, 'must be at most 240 W').optional(),
  eMarker: z.enum(['none', '3a-20v', '5a-20v', '5a-50v-epr']),
  actions: z.array(actionSchema),
  sourceSpecRevision: revisionSchema,
  /** Empty: the simulator's jitter within tTypeCSendSourceCap. */
  capsIntervalMs: z.number({ error: 'enter a number' }).int().min(1, 'must be at least 1 ms').max(10_000, 'must be at most 10 000 ms').optional(),
  sinkSpecRevision: revisionSchema,
  policy: sinkPolicySchema,
  changes: z.array(z.object({ atMs: msSchema, policy: sinkPolicySchema })),
  cableCurrentMa: z.union([z.literal(3_000), z.literal(5_000)]),
  cableResistanceMohm: z.number({ error: 'enter a number' }).int('must be a whole number of mΩ').min(0, 'must be at least 0 mΩ').max(2_000, 'must be at most 2000 mΩ'),
  faults: z.array(faultSchema),
  durationMs: z.number({ error: 'enter a number' }).int('must be a whole number of ms').min(1, 'must be at least 1 ms').max(600_000, 'must be at most 600 000 ms (10 minutes)'),
  seed: z.number({ error: 'enter a number' }).int('must be a whole number'),
});

export type BenchFormValues = z.infer<typeof benchFormSchema>;
/** The Kestrel K65's offers (demo data): 5, 9, 15 V at 3 A, 20 V at 3.25 A, PPS 3.3–21 V at 3 A. */
export const defaultScenario: ScenarioInput = {
  source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b12c', '0x00064145', '0xc1a4213c'] }, specRevision: '3.0' },
  sink: { specRevision: '3.0', policy: { kind: 'max-power' }, changes: [] },
  cable: { currentRatingMa: 3_000, resistanceMohm: 100 },
  faults: [],
  durationMs: 3_000,
  seed: 1,
};

/** Drops `undefined` members so JSON and the engine see absent keys, not nulls. */
function compact<T extends object>(value: T): T {
  return Object.fromEntries(Object.entries(value).filter(([, member]) => member !== undefined)) as T;
}

/** Form values → a scenario input (not yet validated), laid over `base`. */
export function scenarioOfForm(values: BenchFormValues, base: ScenarioInput = defaultScenario): Result<{ scenario: ScenarioInput }> {
  const built = buildOffers(values.offers);
  if (!built.ok) return built;
  const builtEpr = values.eprOffers.length > 0 ? buildOffers(values.eprOffers) : null;
  if (builtEpr && !builtEpr.ok) return fail(builtEpr.error.code, `EPR offers: ${builtEpr.error.message}`);
  const behaviour = compact({ ...base.source.behaviour, capsIntervalMs: values.capsIntervalMs });
  const eMarker = eMarkerChoices[values.eMarker];
  const source = compact({
    ...base.source,
    caps: { pdos: built.pdos.map((pdo) => pdo.raw) },
    eprCaps: builtEpr?.ok ? { pdos: builtEpr.pdos.map((pdo) => pdo.raw) } : undefined,
    specRevision: values.sourceSpecRevision,
    behaviour: Object.keys(behaviour).length > 0 ? behaviour : undefined,
  });
  const scenario: ScenarioInput = {
    ...base,
    source,
    sink: compact({
      ...base.sink,
      specRevision: values.sinkSpecRevision,
      policy: values.policy,
      changes: values.changes,
      epr: values.sinkEprPdpW === undefined ? undefined : { pdpW: values.sinkEprPdpW },
    }),
    cable: compact({ ...base.cable, currentRatingMa: values.cableCurrentMa, resistanceMohm: values.cableResistanceMohm, eMarker: eMarker ? { ...eMarker } : undefined }),
    actions: values.actions,
    faults: values.faults.map((fault) => compact(fault)),
    durationMs: values.durationMs,
    seed: values.seed,
  };
  return { ok: true, scenario };
}

/** A validated scenario → form values. Offers the form cannot hold (reserved types) fail. */
export function formOfScenario(scenario: Scenario): Result<{ values: BenchFormValues }> {
  const caps = resolveCaps(scenario.source.caps);
  if (!caps.ok) return fail('scenario.invalid', `source.caps: ${caps.error.message}`);
  const offers: OfferInput[] = [];
  for (const [index, pdo] of caps.pdos.entries()) {
    if (!['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs'].includes(pdo.kind)) {
      return fail('scenario.invalid', `source.caps: offer ${index + 1} is of a reserved type the form cannot show`);
    }
    offers.push(offerInputOf(pdo));
  }
  const cableCurrentMa = scenario.cable.currentRatingMa > 3_000 ? 5_000 : 3_000;
  const eprOffers: OfferInput[] = [];
  if (scenario.source.eprCaps) {
    const epr = resolveCaps(scenario.source.eprCaps);
    if (!epr.ok) return fail(epr.error.code, `source.eprCaps: ${epr.error.message}`);
    eprOffers.push(...epr.pdos.map(offerInputOf));
  }
  return {
    ok: true,
    values: {
      offers,
      eprOffers,
      sinkEprPdpW: scenario.sink.epr?.pdpW,
      eMarker: eMarkerChoiceOf(scenario.cable.eMarker),
      actions: scenario.actions,
      sourceSpecRevision: scenario.source.specRevision,
      capsIntervalMs: scenario.source.behaviour.capsIntervalMs,
      sinkSpecRevision: scenario.sink.specRevision,
      policy: scenario.sink.policy,
      changes: scenario.sink.changes,
      cableCurrentMa,
      cableResistanceMohm: scenario.cable.resistanceMohm,
      faults: scenario.faults,
      durationMs: scenario.durationMs,
      seed: scenario.seed,
    },
  };
}

/** The form schema and then the engine's own scenarioSchema, so the form refuses what a run would. */
export const benchFormResolverSchema = benchFormSchema.superRefine((values, context) => {
  const mapped = scenarioOfForm(values);
  if (!mapped.ok) {
    context.addIssue({ code: 'custom', path: ['offers'], message: mapped.error.message });
    return;
  }
  const parsed = scenarioSchema.safeParse(mapped.scenario);
  if (parsed.success) return;
  for (const issue of parsed.error.issues) context.addIssue({ code: 'custom', path: formPathOf(issue.path), message: issue.message });
});

/** Where a scenario issue shows in the form. */
function formPathOf(path: readonly PropertyKey[]): (string | number)[] {
  const [head, next, ...rest] = path.map((part) => (typeof part === 'symbol' ? String(part) : part));
  if (head === 'source') return next === 'caps' ? ['offers'] : next === 'eprCaps' ? ['eprOffers'] : next === 'behaviour' ? ['capsIntervalMs'] : ['sourceSpecRevision'];
  if (head === 'sink') return next === 'policy' ? ['policy', ...rest] : next === 'changes' ? ['changes', ...rest] : next === 'epr' ? ['sinkEprPdpW'] : ['sinkSpecRevision'];
  if (head === 'cable') return next === 'resistanceMohm' ? ['cableResistanceMohm'] : next === 'eMarker' ? ['eMarker'] : ['cableCurrentMa'];
  if (head === 'actions') return ['actions', ...(next === undefined ? [] : [next]), ...rest];
  if (head === 'faults') return ['faults', ...(next === undefined ? [] : [next]), ...rest];
  return head === undefined ? ['offers'] : [head];
}

/** JSON text → a validated scenario, with "field: message" errors. */
export function parseScenarioText(text: string): Result<{ scenario: Scenario; input: ScenarioInput }> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return fail('scenario.json', `JSON: ${error instanceof Error ? error.message : String(error)}`);
  }
  const parsed = scenarioSchema.safeParse(json);
  if (!parsed.success) {
    return fail('scenario.invalid', zodMessage(parsed.error, { where: 'scenario', limit: 1 }));
  }
  return { ok: true, scenario: parsed.data, input: json as ScenarioInput };
}
