/**
 * A captured trace as a scenario ("what would have happened if…"): the source's offers are its last
 * Source_Capabilities, the sink's policy follows its Requests (a fixed object → a `fixed` policy at
 * the requested current, a programmable one → `pps`, variable/battery → `range`), later changes of
 * the request become `sink.changes`, and the timing (offer interval, length) comes from the capture.
 */
import { decodeMessage, parseHex } from '../../../../shared/pd/index.ts';
import type { Message, Rdo, SourcePdo, Sop } from '../../../../shared/pd/types.ts';
import type { SinkPolicy } from '../../../../shared/rules/sink-policy.ts';
import type { ScenarioInput } from '../../../../shared/sim/scenario.ts';
import { fail, type Result } from '../../../../shared/core/result.ts';

export type CapturedMessage = { t: number; from?: string; decoded: Message; crcOk?: boolean };

export type DerivedScenario = Result<{ scenario: ScenarioInput; notes: string[] }>;

const REVISIONS = new Set(['2.0', '3.0']);

function revisionOf(message: Message | undefined): '2.0' | '3.0' {
  const revision = message?.header.specRevision;
  return revision && REVISIONS.has(revision) ? (revision as '2.0' | '3.0') : '3.0';
}

function policyOf(rdo: Rdo, offer: SourcePdo | undefined): SinkPolicy | null {
  if (rdo.kind === 'rdo-pps' || rdo.kind === 'rdo-avs') return { kind: 'pps', voltageMv: rdo.outputVoltageMv, currentMa: rdo.operatingCurrentMa };
  if (!offer) return null;
  if (offer.kind === 'fixed' && 'operatingCurrentMa' in rdo) return { kind: 'fixed', voltageMv: offer.voltageMv, currentMa: rdo.operatingCurrentMa };
  if (offer.kind === 'variable' && 'operatingCurrentMa' in rdo) {
    const powerMw = Math.round((offer.minVoltageMv * rdo.operatingCurrentMa) / 1_000);
    return { kind: 'range', minVoltageMv: offer.minVoltageMv, maxVoltageMv: offer.maxVoltageMv, powerMw };
  }
  if (offer.kind === 'battery' && 'operatingPowerMw' in rdo) {
    return { kind: 'range', minVoltageMv: offer.minVoltageMv, maxVoltageMv: offer.maxVoltageMv, powerMw: rdo.operatingPowerMw };
  }
  return null;
}

const samePolicy = (a: SinkPolicy, b: SinkPolicy) => JSON.stringify(a) === JSON.stringify(b);

/** Messages are in time order; only good (crcOk) SOP messages count. */
export function scenarioFromMessages(messages: readonly CapturedMessage[], options: { endUs?: number } = {}): DerivedScenario {
  const good = messages.filter((item) => item.crcOk !== false && (item.decoded.sop ?? 'SOP') === 'SOP');
  const capsList = good.filter((item) => item.decoded.header.messageType === 'Source_Capabilities');
  const lastCaps = capsList[capsList.length - 1];
  if (!lastCaps) return fail('trace.no-offers', 'The trace has no Source_Capabilities message, so there are no offers to start from.');
  const offers = lastCaps.decoded.objects as SourcePdo[];
  const notes: string[] = [`Offers from the Source_Capabilities at ${(lastCaps.t / 1_000).toFixed(1)} ms.`];

  const requests = good.filter((item) => item.decoded.header.messageType === 'Request');
  const choices: { atMs: number; policy: SinkPolicy }[] = [];
  for (const request of requests) {
    const rdo = request.decoded.objects[0] as Rdo | undefined;
    if (!rdo || !('objectPosition' in rdo)) continue;
    const policy = policyOf(rdo, offers[rdo.objectPosition - 1]);
    if (!policy) continue;
    const last = choices[choices.length - 1];
    if (!last || !samePolicy(last.policy, policy)) choices.push({ atMs: Math.floor(request.t / 1_000), policy });
  }
  const [first, ...later] = choices;
  if (!first) notes.push('No Request the offers explain: the sink takes the most power it can.');

  // Repeated offers before the first Request give the source's interval.
  const firstRequestUs = requests[0]?.t ?? Number.POSITIVE_INFINITY;
  const early = capsList.filter((item) => item.t < firstRequestUs);
  const gaps = early.slice(1).map((item, index) => item.t - early[index]!.t);
  const capsIntervalMs = gaps.length > 0 ? Math.round(Math.min(...gaps) / 1_000) : undefined;

  const lastUs = Math.max(options.endUs ?? 0, messages[messages.length - 1]?.t ?? 0);
  const durationMs = Math.min(600_000, Math.max(1_000, Math.ceil(lastUs / 1_000) + 500));

  // A sink that asked for more than 3 A was on a 5 A cable (USB Type-C R2.3 §4.9, from memory).
  const overThreeAmps = choices.some(({ policy }) => 'currentMa' in policy && policy.currentMa > 3_000);
  if (overThreeAmps) notes.push('The sink asked for more than 3 A, so the cable is taken as a 5 A one.');

  const scenario: ScenarioInput = {
    source: {
      caps: { pdos: offers.map((pdo) => pdo.raw) },
      specRevision: revisionOf(lastCaps.decoded),
      ...(capsIntervalMs !== undefined && capsIntervalMs >= 1 && capsIntervalMs <= 10_000 ? { behaviour: { capsIntervalMs } } : {}),
    },
    sink: { specRevision: revisionOf(requests[0]?.decoded ?? lastCaps.decoded), policy: first?.policy ?? { kind: 'max-power' }, changes: later },
    ...(overThreeAmps ? { cable: { currentRatingMa: 5_000 } } : {}),
    durationMs,
    seed: 1,
  };
  return { ok: true, scenario, notes };
}

type Loose = Record<string, unknown>;
const isObject = (value: unknown): value is Loose => typeof value === 'object' && value !== null && !Array.isArray(value);

/**
 * The timeline messages of a `GET /api/traces/:id` body: the analysis itself, or wrapped as
 * `{ analysis }` / `{ trace: { analysis } }`. The server stores messages as hex without their
 * decoded form, so the few a scenario needs (Source_Capabilities, and Requests typed by the offers
 * before them) are decoded here, on demand.
 */
export function capturedMessagesOf(body: unknown): { messages: CapturedMessage[]; endUs?: number } | null {
  const candidates: unknown[] = [body];
  if (isObject(body)) candidates.push(body.analysis, body.trace, isObject(body.trace) ? body.trace.analysis : undefined);
  for (const candidate of candidates) {
    if (!isObject(candidate) || !isObject(candidate.timeline) || !Array.isArray(candidate.timeline.messages)) continue;
    const messages: CapturedMessage[] = [];
    let offers: SourcePdo[] | undefined;
    for (const item of candidate.timeline.messages as unknown[]) {
      if (!isObject(item) || typeof item.t !== 'number') continue;
      const decoded = isObject(item.decoded) && isObject(item.decoded.header) ? (item.decoded as unknown as Message) : decodeStored(item, offers);
      if (!decoded) continue;
      if (decoded.header.messageType === 'Source_Capabilities' && item.crcOk !== false) offers = decoded.objects as SourcePdo[];
      messages.push({ t: item.t, decoded, ...(typeof item.from === 'string' ? { from: item.from } : {}), ...(typeof item.crcOk === 'boolean' ? { crcOk: item.crcOk } : {}) });
    }
    const measurements = Array.isArray(candidate.timeline.measurements) ? (candidate.timeline.measurements as unknown[]) : [];
    const lastMeasurement = measurements[measurements.length - 1];
    return { messages, endUs: isObject(lastMeasurement) && typeof lastMeasurement.t === 'number' ? lastMeasurement.t : undefined };
  }
  return null;
}

const NEEDED = new Set(['Source_Capabilities', 'Request']);

function decodeStored(item: Loose, offers: SourcePdo[] | undefined): Message | undefined {
  if (typeof item.hex !== 'string' || typeof item.messageType !== 'string' || !NEEDED.has(item.messageType)) return undefined;
  const bytes = parseHex(item.hex);
  if (!bytes.ok) return undefined;
  const sop = (typeof item.sop === 'string' ? item.sop : 'SOP') as Sop;
  const decoded = decodeMessage(bytes.bytes, { sop, ...(item.messageType === 'Request' && offers ? { caps: offers } : {}) });
  return decoded.ok ? decoded.message : undefined;
}
