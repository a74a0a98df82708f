/**
 * The source's offers as the trace shows them: the Source_Capabilities in force (for reading
 * Requests), each distinct list checked once against the rules engine (Power Rules, structure,
 * cable), a PD 2.0 header on APDOs (`caps.revision`; APDOs exist from Revision 3.0, USB PD R3.2 V1.1
 * §6.4.1), and the interval between unanswered repeats before a contract (tTypeCSendSourceCap,
 * §6.6 Time Values; §8.3.3.2 PE_SRC_Discovery).
 */
import type { Finding } from '../core/finding.ts';
import type { TimerTable } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import { checkCaps } from '../rules/check-caps.ts';
import { millis, seconds } from './format.ts';
import { remember, type AnalyserMemo } from './memo.ts';
import type { Report, SeenMessage } from './seen.ts';

const SOURCE_PDO_KINDS: readonly string[] = ['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs'];
/** Distinct offer lists checked (a source repeats the same list; the MessageID alone would make eight copies). */
const CHECKED_LIMIT = 1_024;

export interface Offers {
  m: SeenMessage;
  pdos: SourcePdo[];
  /** The data objects' hex: names the list whatever its header. */
  key: string;
}

export interface OffersTracker {
  /** Source_Capabilities from the source; returns the offers when they are all source PDOs. */
  onCaps(m: SeenMessage, contractHolds: boolean, timers: TimerTable): Offers | undefined;
  /** The sink answered: a later repeat is no longer an unanswered one. */
  answered(): void;
  current(): Offers | undefined;
  reset(): void;
}

/** `memo` shares each offer list's rules-engine findings with other analysers (memo.ts). */
export function createOffersTracker(report: Report, finding: (f: Finding) => void, memo?: AnalyserMemo): OffersTracker {
  let offers: Offers | undefined;
  let lastUnanswered: SeenMessage | undefined;
  const checked = new Set<string>();
  const at = (m: SeenMessage) => ({ t: m.t, line: m.line });

  return {
    onCaps(m, contractHolds, timers) {
      const pdos = m.d.message.objects.filter((o): o is SourcePdo => SOURCE_PDO_KINDS.includes(o.kind));
      if (pdos.length !== m.d.message.objects.length) return undefined;
      const { tTypeCSendSourceCap } = timers;
      if (lastUnanswered && lastUnanswered.ackEndUs === undefined && !contractHolds) {
        const gapUs = m.t - lastUnanswered.t;
        if (gapUs < tTypeCSendSourceCap.minUs || gapUs > tTypeCSendSourceCap.maxUs) {
          report(
            'timing.caps-interval',
            `The source repeated Source_Capabilities ${millis(gapUs)} after the unanswered one at ${seconds(lastUnanswered.t)}; tTypeCSendSourceCap is ${millis(tTypeCSendSourceCap.minUs)} to ${millis(tTypeCSendSourceCap.maxUs)}.`,
            { ...at(m), ref: tTypeCSendSourceCap.ref },
          );
        }
      }
      lastUnanswered = m;
      const key = m.d.hex.slice(4);
      offers = { m, pdos, key };
      if (!checked.has(key) && checked.size < CHECKED_LIMIT) {
        checked.add(key);
        for (const f of remember(memo, 'capsFindings', key, () => checkCaps(pdos).findings)) finding({ ...f, t: m.t, ...(m.line !== undefined ? { line: m.line } : {}) });
        const apdo = pdos.findIndex((p) => p.kind === 'pps' || p.kind === 'epr-avs' || p.kind === 'spr-avs');
        if (apdo >= 0 && (m.d.revision === '2.0' || m.d.revision === '1.0')) {
          report(
            'caps.revision',
            `The source's Source_Capabilities at ${seconds(m.t)} say Specification Revision ${m.d.revision} but object ${apdo + 1} is a programmable (augmented) offer, which exists only from Revision 3.0.`,
            { ...at(m), object: apdo + 1 },
          );
        }
      }
      return offers;
    },
    answered() {
      lastUnanswered = undefined;
    },
    current: () => offers,
    reset() {
      offers = undefined;
      lastUnanswered = undefined;
    },
  };
}
