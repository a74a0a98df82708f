/**
 * What each port's policy engines may ask of the run, built once per run from the scenario: the
 * source's offers for what it knows of the cable, its PDP and VBUS now; the sink's cable current,
 * revision, EPR PDP, Sink_Capabilities and swap answer. Everything derived from the scenario alone
 * is memoised by the scenario's own arrays, so runs of one scenario share it (the fast path).
 */
import type { SourcePdo } from '../pd/types.ts';
import type { SinkPolicy } from '../rules/sink-policy.ts';
import { UNMARKED_CABLE, type EMarker } from './cable-identity.ts';
import { offersFor, type OffersFor } from './offers.ts';
import { derivedSinkCaps } from './port-answers.ts';
import type { Scenario } from './scenario.ts';
import type { SinkContext } from './sink-pe.ts';
import type { SourceContext, SwapAnswer } from './source-pe.ts';
import type { Side } from './types.ts';
import type { VbusPath } from './vbus-path.ts';
import type { Revision } from './wire.ts';

/** One fixed 5 V 1.5 A object (voltage b19..10 in 50 mV, current b9..0 in 10 mA): what a port offers or asks for after a PR_Swap when the scenario names none. */
const VSAFE5V_1A5 = [0x0001_9096];

const wordsMemo = new WeakMap<readonly string[], number[]>();
/** A list of hex words as numbers, memoised by the scenario's array. */
function hexWords(pdos: readonly string[] | undefined): number[] | undefined {
  if (!pdos) return undefined;
  let words = wordsMemo.get(pdos);
  if (!words) {
    words = pdos.map((text) => Number.parseInt(text.trim().replace(/^0x/i, ''), 16) >>> 0);
    wordsMemo.set(pdos, words);
  }
  return words;
}

const pdpMemo = new WeakMap<readonly SourcePdo[], number>();
/** A source's PDP (W): its strongest fixed offer, memoised by the offers array. */
function pdpW(pdos: readonly SourcePdo[]): number {
  let watts = pdpMemo.get(pdos);
  if (watts === undefined) {
    watts = 0;
    for (const pdo of pdos) if (pdo.kind === 'fixed') watts = Math.max(watts, (pdo.voltageMv * pdo.maxCurrentMa) / 1e6);
    watts = Math.round(watts);
    pdpMemo.set(pdos, watts);
  }
  return watts;
}

/** Some offer needs a 5 A cable: the source discovers the cable before its first offers. */
function needsFiveAmps(pdos: readonly SourcePdo[]): boolean {
  return pdos.some((pdo) => (pdo.kind === 'fixed' || pdo.kind === 'variable' || pdo.kind === 'pps') && pdo.maxCurrentMa > 3_000);
}

const sinkCapsMemo = new WeakMap<SinkPolicy, number[]>();
function sinkCapsOf(policy: SinkPolicy): number[] {
  let words = sinkCapsMemo.get(policy);
  if (!words) {
    words = derivedSinkCaps(policy);
    sinkCapsMemo.set(policy, words);
  }
  return words;
}

/** The cable's e-marker: a 5 A cable without an explicit one still answers as 5 A, 20 V, not EPR capable (vector.md). */
export function cableMarker(cable: Scenario['cable']): EMarker | null {
  return cable.eMarker ?? (cable.currentRatingMa >= 5_000 ? { currentMa: 5_000, maxVoltageMv: 20_000, eprCapable: false } : null);
}

/** A port's source context (a class: no closures per run). */
class PortSourceContext implements SourceContext {
  private readonly pdp: { spr: number; epr: number };
  constructor(
    readonly offers: OffersFor,
    readonly eprCapable: boolean,
    readonly discoverCable: boolean,
    readonly swapAnswer: SwapAnswer,
    sprPdpW: number,
    eprPdpW: number,
    private readonly vbus: VbusPath,
  ) {
    this.pdp = { spr: sprPdpW, epr: eprPdpW };
  }
  pdpW(): { spr: number; epr: number } {
    return this.pdp;
  }
  vbusMv(): number {
    return this.vbus.vbusMv();
  }
}

/** A port's sink context; its decode memo hands back the source's own offer arrays already decoded (same result, no work). */
class PortSinkContext implements SinkContext {
  constructor(
    readonly cableMa: number,
    readonly ownRevision: Revision,
    readonly eprPdpW: number | null,
    readonly sinkCaps: readonly number[],
    readonly swapAnswer: SwapAnswer,
    private readonly offersOf: OffersFor,
    private readonly marker: EMarker | null,
  ) {}
  decodeOffers(words: readonly number[]): SourcePdo[] | undefined {
    for (const cable of [null, this.marker]) {
      const offers = this.offersOf(cable, false);
      if (offers.words === words) return offers.pdos as SourcePdo[];
    }
    return undefined;
  }
}

export interface PortContexts {
  source: Record<Side, SourceContext>;
  sink: Record<Side, SinkContext>;
}

/** Both ports' contexts for both power roles (a PR_Swap makes the sink's port a source and back). */
export function portContexts(scenario: Scenario, caps: { words: number[]; pdos: SourcePdo[] }, marker: EMarker | null, vbus: VbusPath): PortContexts {
  const { currentRatingMa } = scenario.cable;
  const cableMa = (marker ?? UNMARKED_CABLE).currentMa === 5_000 ? Math.max(currentRatingMa, 5_000) : currentRatingMa;
  const eprWords = hexWords(scenario.source.eprCaps?.pdos) ?? null;
  const offers = offersFor(caps.words, eprWords, caps.pdos);
  const swapOffers = offersFor(hexWords(scenario.sink.swapCaps?.pdos) ?? VSAFE5V_1A5, null);
  const sourceAnswer = scenario.source.behaviour.swapAnswer;
  const sinkAnswer = scenario.sink.behaviour.swapAnswer;
  const eprPdpW = eprWords ? pdpW(offers(marker, true).pdos) : 0;
  return {
    source: {
      source: new PortSourceContext(offers, eprWords !== null, eprWords !== null || needsFiveAmps(caps.pdos), sourceAnswer, pdpW(caps.pdos), eprPdpW, vbus),
      sink: new PortSourceContext(swapOffers, false, false, sinkAnswer, pdpW(swapOffers(null, false).pdos), 0, vbus),
    },
    sink: {
      sink: new PortSinkContext(
        cableMa,
        scenario.sink.specRevision,
        scenario.sink.epr?.pdpW ?? null,
        hexWords(scenario.sink.caps?.pdos) ?? sinkCapsOf(scenario.sink.policy),
        sinkAnswer,
        offers,
        marker,
      ),
      source: new PortSinkContext(cableMa, scenario.source.specRevision, null, VSAFE5V_1A5, sourceAnswer, offers, marker),
    },
  };
}
