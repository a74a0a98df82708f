/**
 * Checks a Request against the offers it refers to: the position exists, the current (or power)
 * stays within the offer, a programmable voltage stays within the range.
 *
 * Source: USB PD R3.1 V1.8 §6.4.2 Request Message and its RDO tables (Tables 6-21 to 6-26), the
 * Capability Mismatch rule that lets Maximum Operating Current exceed the offer (§6.4.2), and
 * §8.3.3.2 (the source Rejects an invalid request) — from memory. SPR AVS: 9–15 V at the 15 V
 * current, 15–20 V at the 20 V current (R3.2 V1.1 §6.4.1.2.5, from memory).
 */
import type { Finding } from '../core/finding.ts';
import type { Rdo, SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { typedRdo } from './contract-of.ts';
import { describePdo, isPadding, voltageRangeMv } from './pdo-facts.ts';

/** AVS output voltage resolution (§6.4.2 AVS RDO; from memory). */
const AVS_STEP_MV = 100;
/** An EPR AVS contract carries at most 5 A, whatever PDP/V gives (§6.4.1.3.4 EPR AVS APDO, §10.2.3.x; from memory). */
const EPR_AVS_MAX_MA = 5_000;

const V = (mv: number) => `${mv / 1_000} V`;
const A = (ma: number) => `${ma / 1_000} A`;
const W = (mw: number) => `${mw / 1_000} W`;

export function checkRequest(rdo: Rdo, pdos: readonly SourcePdo[], options: { t?: number } = {}): Finding[] {
  const at = options.t === undefined ? {} : { t: options.t };
  const position = rdo.objectPosition;
  const pdo = position >= 1 ? pdos[position - 1] : undefined;
  if (!pdo || isPadding(pdo)) {
    const offered = pdos.filter((p) => !isPadding(p)).length;
    return [
      makeFinding(
        'request.position',
        `The Request names object ${position}, but the source offered ${offered === 0 ? 'nothing' : `objects 1 to ${pdos.length}`}${pdo ? ' and that position is empty' : ''}.`,
        { ...at, object: position },
      ),
    ];
  }
  const r = typedRdo(rdo, pdo);
  const where = { ...at, object: position };
  const what = `object ${position} (${describePdo(pdo)})`;
  const findings: Finding[] = [];

  if ((r.kind === 'rdo-fixed' || r.kind === 'rdo-variable' || r.kind === 'rdo') && (pdo.kind === 'fixed' || pdo.kind === 'variable')) {
    if (r.operatingCurrentMa > pdo.maxCurrentMa) {
      findings.push(makeFinding('request.exceeds-offer', `The Request asks for ${A(r.operatingCurrentMa)} from ${what}, which allows at most ${A(pdo.maxCurrentMa)}.`, where));
    } else if (r.maxOperatingCurrentMa > pdo.maxCurrentMa && !r.capabilityMismatch) {
      findings.push(
        makeFinding('request.exceeds-offer', `The Request gives a maximum of ${A(r.maxOperatingCurrentMa)} for ${what}, above its ${A(pdo.maxCurrentMa)}, without setting Capability Mismatch.`, where),
      );
    }
  } else if (r.kind === 'rdo-battery' && pdo.kind === 'battery') {
    if (r.operatingPowerMw > pdo.maxPowerMw) {
      findings.push(makeFinding('request.exceeds-offer', `The Request asks for ${W(r.operatingPowerMw)} from ${what}, which allows at most ${W(pdo.maxPowerMw)}.`, where));
    } else if (r.maxOperatingPowerMw > pdo.maxPowerMw && !r.capabilityMismatch) {
      findings.push(
        makeFinding('request.exceeds-offer', `The Request gives a maximum of ${W(r.maxOperatingPowerMw)} for ${what}, above its ${W(pdo.maxPowerMw)}, without setting Capability Mismatch.`, where),
      );
    }
  } else if (r.kind === 'rdo-pps' || r.kind === 'rdo-avs') {
    const { minMv, maxMv } = voltageRangeMv(pdo);
    if (r.outputVoltageMv < minMv || r.outputVoltageMv > maxMv) {
      findings.push(makeFinding('request.out-of-range', `The Request asks for ${V(r.outputVoltageMv)} from ${what}, outside its ${V(minMv).slice(0, -2)}–${V(maxMv)} range.`, where));
    } else if (r.kind === 'rdo-avs' && r.outputVoltageMv % AVS_STEP_MV !== 0) {
      // AVS RDO: Output Voltage in 25 mV units with the two lowest bits zero, i.e. 100 mV steps (§6.4.2, AVS RDO table; from memory).
      findings.push(makeFinding('request.out-of-range', `The Request asks for ${V(r.outputVoltageMv)} from ${what}; an adjustable (AVS) request must be in 100 mV steps.`, where));
    }
    const limitMa =
      pdo.kind === 'pps'
        ? pdo.maxCurrentMa
        : pdo.kind === 'spr-avs'
          ? r.outputVoltageMv <= 15_000
            ? pdo.maxCurrent15vMa
            : pdo.maxCurrent20vMa
          : pdo.kind === 'epr-avs' && r.outputVoltageMv > 0
            ? Math.min(EPR_AVS_MAX_MA, Math.floor((pdo.pdpW * 1_000_000) / r.outputVoltageMv))
            : Number.POSITIVE_INFINITY;
    if (r.operatingCurrentMa > limitMa) {
      const limit = pdo.kind === 'epr-avs' ? `the lower of 5 A and its ${pdo.pdpW} W at that voltage, ${A(limitMa)}` : A(limitMa);
      findings.push(makeFinding('request.exceeds-offer', `The Request asks for ${A(r.operatingCurrentMa)} from ${what}, which allows at most ${limit}.`, where));
    }
  }
  return findings;
}
