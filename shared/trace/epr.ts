/**
 * EPR mode as a capture shows it (USB PD R3.2 V1.1 §6.4.9 EPR_Mode, §8.3.3.26 EPR entry and exit,
 * §6.5.15 EPR_Source_Capabilities, §6.4.2 EPR_Request, §6.5.14 Extended_Control — from memory):
 * - the way in: an explicit SPR contract, the sink's EPR_Mode (Enter), the source's Enter
 *   Acknowledged, then Enter Succeeded, which the source sends only over an EPR-capable cable;
 * - in EPR mode the source offers EPR_Source_Capabilities (chunked: put back together here and
 *   checked against the EPR Power Rules), the sink answers with EPR_Request, whose second object is
 *   a copy of the offer it names;
 * - the sink keeps EPR mode alive: in the Ready state it sends a message (EPR_KeepAlive when it has
 *   nothing else) at least every tSinkEPRKeepAlive; the source, hearing nothing for
 *   tSourceEPRKeepAlive, leaves with a Hard Reset.
 */
import type { Finding } from '../core/finding.ts';
import { timersFor } from '../core/timers.ts';
import { createChunkAssembler, decodeRdo, decodeSourcePdo } from '../pd/index.ts';
import type { SourcePdo } from '../pd/types.ts';
import { checkCaps } from '../rules/check-caps.ts';
import { checkRequest } from '../rules/check-request.ts';
import { paddingPdo } from '../rules/pdo-builders.ts';
import { describePdo } from '../rules/pdo-facts.ts';
import { cableText, type CableIdentity } from './cable.ts';
import { objectAt } from './decode-cache.ts';
import { millis, seconds } from './format.ts';
import type { Report, SeenMessage } from './seen.ts';

const EPR_MODE_ACTIONS: Record<number, string> = { 1: 'Enter', 2: 'Enter Acknowledged', 3: 'Enter Succeeded', 4: 'Enter Failed', 5: 'Exit' };
const SOURCE_PDO_KINDS: readonly string[] = ['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs'];
const CHECKED_LIMIT = 256;
const PADDING: SourcePdo = paddingPdo();

export interface EprContext {
  /** The cable's Discover Identity, when the trace holds one. */
  cable(): CableIdentity | undefined;
  /** An explicit contract holds. */
  hasContract(): boolean;
  /** A finding of the rules engine, passed on. */
  finding(f: Finding): void;
}

export interface EprTracker {
  /** A message the receiver took (SOP only), after the policy has seen it. */
  onMessage(m: SeenMessage, steady: boolean): void;
  /** Keep-alive deadline; `steady`: the sink is in its Ready state (no transition under way). */
  advance(t: number, steady: boolean): void;
  inEpr(): boolean;
  /** The EPR offers in force (for reading an EPR_Request). */
  offers(): SourcePdo[] | undefined;
  offersKey(): string;
  /** The likely cause of a Hard Reset at `t`, when keep-alives had stopped. */
  hardResetCause(t: number): string | undefined;
  reset(t: number): void;
}

export function createEprTracker(report: Report, ctx: EprContext): EprTracker {
  let mode: 'spr' | 'entering' | 'epr' = 'spr';
  let offers: { pdos: SourcePdo[]; key: string } | undefined;
  /** When the sink's keep-alive clock last started: its last message, or the end of a transition. */
  let aliveUs = 0;
  let keepAlive: { reported: boolean; finding?: Finding; closed?: boolean } = { reported: false };
  let wasSteady = false;
  const assembler = createChunkAssembler();
  const checked = new Set<string>();
  const timers = () => timersFor('3.0');
  const at = (m: SeenMessage) => ({ t: m.t, ...(m.line !== undefined ? { line: m.line } : {}) });

  const entry = (m: SeenMessage, why: string): void => {
    report('epr.entry', `The ${m.from}'s ${m.d.messageType} at ${seconds(m.t)} came ${why}.`, at(m));
  };
  const restartKeepAlive = (t: number): void => {
    aliveUs = t;
    keepAlive = { reported: false };
  };
  /** The sink's timer runs in its Ready state only: the end of a transition (Accept → PS_RDY) restarts it. */
  const settle = (steady: boolean, t: number): void => {
    if (mode === 'epr' && steady && !wasSteady) restartKeepAlive(t);
    wasSteady = steady;
  };
  const closeKeepAlive = (clause: string): void => {
    if (!keepAlive.finding || keepAlive.closed) return;
    keepAlive.finding.message = keepAlive.finding.message.replace(/\.$/, `; ${clause}.`);
    keepAlive.closed = true;
  };

  const onEprMode = (m: SeenMessage): void => {
    const word = objectAt(m.d.bytes, 1);
    if (word === undefined) return;
    const action = EPR_MODE_ACTIONS[(word >>> 24) & 0xff];
    if (action === 'Enter' && m.from === 'sink') {
      if (!ctx.hasContract()) entry(m, 'before any explicit SPR contract: a sink asks for EPR mode only from an explicit contract (EPR_Mode Enter)');
      mode = 'entering';
    } else if (action === 'Enter Succeeded' && m.from === 'source') {
      if (mode !== 'entering') entry(m, "saying Enter Succeeded without the sink's EPR_Mode (Enter) before it");
      const cable = ctx.cable();
      if (cable && (!cable.eprCapable || (cable.currentMa ?? 0) < 5_000)) {
        report('epr.entry', `The source let EPR mode begin at ${seconds(m.t)} over ${cableText(cable)} (Discover Identity at ${seconds(cable.t)}); EPR needs an EPR-capable 50 V, 5 A cable.`, at(m));
      }
      mode = 'epr';
      restartKeepAlive(m.ackEndUs ?? m.endUs);
    } else if (action === 'Enter Failed' || action === 'Exit') {
      if (mode === 'epr' && m.from === 'source') closeKeepAlive(`the source left EPR mode at ${seconds(m.t)}`);
      mode = 'spr';
      offers = undefined;
    }
  };

  const onEprCaps = (m: SeenMessage): void => {
    const step = assembler.push(m.d.message);
    if (step.state !== 'complete') return;
    const pdos: SourcePdo[] = [];
    for (const o of step.message.objects) {
      // Unused SPR positions 5–7 are all-zero objects (§6.5.15.1), which the codec leaves raw.
      if (o.kind === 'raw' && Number.parseInt(o.raw, 16) === 0) pdos.push(PADDING);
      else if (SOURCE_PDO_KINDS.includes(o.kind)) pdos.push(o as SourcePdo);
      else return;
    }
    if (mode !== 'epr') entry(m, 'outside EPR mode: EPR offers come only after EPR_Mode (Enter Succeeded)');
    const key = step.message.payload ?? '';
    offers = { pdos, key };
    if (checked.has(key) || checked.size >= CHECKED_LIMIT) return;
    checked.add(key);
    // In EPR mode the source has already checked the cable (§8.3.3.26): an unknown cable is taken as fit.
    const cable = ctx.cable();
    const options = cable ? { cableMa: cable.currentMa ?? 3_000, cableEpr: cable.eprCapable } : mode === 'epr' ? { cableMa: 5_000, cableEpr: true } : {};
    for (const f of checkCaps(pdos, { epr: true, ...options }).findings) ctx.finding({ ...f, ...at(m) });
  };

  const onEprRequest = (m: SeenMessage): void => {
    if (mode !== 'epr') entry(m, 'outside EPR mode: a sink sends EPR_Request only after EPR_Mode (Enter Succeeded)');
    const rdo = objectAt(m.d.bytes, 1);
    const copy = objectAt(m.d.bytes, 2);
    if (rdo === undefined || copy === undefined || !offers) return;
    const position = (rdo >>> 28) & 0xf;
    const offered = offers.pdos[position - 1];
    const key = `${offers.key} ${rdo}`;
    if (!checked.has(key) && checked.size < CHECKED_LIMIT) {
      checked.add(key);
      for (const f of checkRequest(decodeRdo(rdo, offered), offers.pdos, { t: m.t })) ctx.finding({ ...f, ...at(m) });
    }
    if (!offered) return;
    const offeredRaw = Number.parseInt(offered.raw, 16) >>> 0;
    if (offeredRaw !== copy) {
      const decoded = decodeSourcePdo(copy);
      const said = SOURCE_PDO_KINDS.includes(decoded.kind) ? ` (${describePdo(decoded as SourcePdo)})` : '';
      report(
        'request.epr-copy',
        `The sink's EPR_Request at ${seconds(m.t)} names object ${position} but carries the copy 0x${copy.toString(16).padStart(8, '0')}${said}, not the offered 0x${offeredRaw.toString(16).padStart(8, '0')} (${describePdo(offered)}).`,
        { ...at(m), object: position },
      );
    }
  };

  return {
    onMessage(m, steady) {
      if (m.sop !== 'SOP') return;
      const type = m.d.messageType;
      // SinkEPRKeepAliveTimer starts on each entry to the sink's Ready state (USB PD R3.1 §8.3.3.3.11,
      // from memory), which follows every exchange in either direction, not the sink's own message.
      if (mode === 'epr') restartKeepAlive(m.ackEndUs ?? m.endUs);
      if (type === 'EPR_Mode') onEprMode(m);
      else if (type === 'EPR_Source_Capabilities' && m.from === 'source') onEprCaps(m);
      else if (type === 'EPR_Request' && m.from === 'sink') onEprRequest(m);
      else if (type === 'Source_Capabilities' && m.from === 'source' && mode === 'epr') {
        // SPR offers in EPR mode mean the source left it (§8.3.3.26.3, from memory).
        mode = 'spr';
        offers = undefined;
      }
      settle(steady, m.ackEndUs ?? m.endUs);
    },
    advance(t, steady) {
      if (mode !== 'epr') return;
      settle(steady, t);
      if (!steady || keepAlive.reported) return;
      // A sink starts its EPR_KeepAlive when the timer expires; the message reaches the line a few
      // milliseconds later. Allow that latency, bounded by tReceiverResponse (common practice), so a
      // compliant sink is never reported.
      const { tSinkEPRKeepAlive, tReceiverResponse } = timers();
      if (t <= aliveUs + tSinkEPRKeepAlive.maxUs + tReceiverResponse.maxUs) return;
      keepAlive.reported = true;
      keepAlive.finding = report(
        'timing.epr-keepalive',
        `The sink sent no EPR_KeepAlive (nor any other message) within tSinkEPRKeepAlive (${millis(tSinkEPRKeepAlive.maxUs)}) after ${seconds(aliveUs)} while EPR mode held.`,
        { t: aliveUs + tSinkEPRKeepAlive.maxUs + tReceiverResponse.maxUs, ref: tSinkEPRKeepAlive.ref },
      );
    },
    inEpr: () => mode === 'epr',
    offers: () => offers?.pdos,
    offersKey: () => (offers ? `epr ${offers.key}` : ''),
    hardResetCause(t) {
      if (mode !== 'epr') return undefined;
      const { tSourceEPRKeepAlive } = timers();
      const silentUs = t - aliveUs;
      if (silentUs < tSourceEPRKeepAlive.minUs) return undefined;
      closeKeepAlive(`a Hard Reset followed ${millis(silentUs)} after it`);
      return `the sink sent no EPR_KeepAlive for ${millis(silentUs)} in EPR mode (tSourceEPRKeepAlive ${millis(tSourceEPRKeepAlive.minUs)}–${millis(tSourceEPRKeepAlive.maxUs)})`;
    },
    reset() {
      mode = 'spr';
      offers = undefined;
      assembler.reset();
      keepAlive = { reported: false };
    },
  };
}
