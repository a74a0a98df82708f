/**
 * Printed ratings: reads the usual forms of an adapter's output label and compares them with the
 * offers. Forms read (common practice of label printing; IEC 60417-5031 is the ⎓ "direct current"
 * symbol): `5V⎓3A`, `5V=3A`, `5V 3A`, `5.0V/3.0A`, `5VDC 3A`, entries separated by commas, slashes,
 * semicolons or spaces; `5V/9V 3A` (one current for several voltages); ranges `PPS 3.3-21V⎓3A`,
 * `3.3–21V 3A`; wattage `65W`, `65W max`.
 */
import type { Finding } from '../core/finding.ts';
import { fail, type Result } from '../core/result.ts';
import type { SourcePdo } from '../pd/types.ts';
import { makeFinding } from './catalog.ts';
import { isPadding } from './pdo-facts.ts';

export interface LabelEntry {
  /** Equal for a single voltage. */
  minVoltageMv: number;
  maxVoltageMv: number;
  /** Absent when the label gives a voltage without a current. */
  currentMa?: number;
}

export interface PrintedRating {
  entries: LabelEntry[];
  /** The highest wattage printed, if any. */
  powerW?: number;
}

const NUMBER = String.raw`(\d+(?:[.,]\d+)?)`;
// One token: a voltage or range ("3.3-21V", "5VDC"), a current ("3.25A"), or a wattage ("65W").
const TOKEN = new RegExp(String.raw`${NUMBER}\s*(?:[-–~]\s*${NUMBER}\s*)?(V(?:DC)?|A|W)(?![a-z])`, 'giu');

function toMilli(text: string): number {
  return Math.round(Number.parseFloat(text.replace(',', '.')) * 1_000);
}

export function parseLabel(label: string): Result<{ rating: PrintedRating }> {
  const entries: LabelEntry[] = [];
  let pending: LabelEntry[] = [];
  let powerW: number | undefined;
  for (const match of label.matchAll(TOKEN)) {
    const [, first = '', second, unitRaw = ''] = match;
    const unit = unitRaw.toUpperCase();
    if (unit.startsWith('V')) {
      const a = toMilli(first);
      const b = second === undefined ? a : toMilli(second);
      const entry: LabelEntry = { minVoltageMv: Math.min(a, b), maxVoltageMv: Math.max(a, b) };
      entries.push(entry);
      pending.push(entry);
    } else if (unit === 'A') {
      if (second !== undefined) continue; // a current range says nothing we compare
      for (const entry of pending) entry.currentMa = toMilli(first);
      pending = [];
    } else {
      const watts = Number.parseFloat(first.replace(',', '.'));
      powerW = Math.max(powerW ?? 0, watts);
      pending = [];
    }
  }
  if (entries.length === 0 && powerW === undefined) {
    return fail('input.label', `label: "${label}" names no voltage, current or wattage (expected forms like "5V⎓3A, 9V⎓3A, 65W max")`);
  }
  return { ok: true, rating: powerW === undefined ? { entries } : { entries, powerW } };
}

const v = (mv: number) => `${mv / 1_000} V`;
const a = (ma: number) => `${ma / 1_000} A`;

/** caps.label-mismatch findings: a labelled voltage not offered, a current that differs, a wattage other than the PDP. */
export function checkLabel(pdos: readonly SourcePdo[], label: string, pdpW: number): Finding[] {
  const parsed = parseLabel(label);
  if (!parsed.ok) return [makeFinding('caps.label-mismatch', `The printed rating "${label}" could not be read, so it was not compared with the offers.`)];
  const { entries, powerW } = parsed.rating;
  const findings: Finding[] = [];
  for (const entry of entries) {
    const single = entry.minVoltageMv === entry.maxVoltageMv;
    const index = pdos.findIndex((p) =>
      isPadding(p)
        ? false
        : single
          ? p.kind === 'fixed' && p.voltageMv === entry.minVoltageMv
          : (p.kind === 'pps' || p.kind === 'variable' || p.kind === 'epr-avs') && p.minVoltageMv === entry.minVoltageMv && p.maxVoltageMv === entry.maxVoltageMv,
    );
    const what = single ? v(entry.minVoltageMv) : `${v(entry.minVoltageMv).slice(0, -2)}–${v(entry.maxVoltageMv)}`;
    const offer = pdos[index];
    if (!offer) {
      findings.push(
        makeFinding('caps.label-mismatch', `The label names ${what}${entry.currentMa === undefined ? '' : ` at ${a(entry.currentMa)}`}, but no such ${single ? 'fixed supply' : 'range'} is offered.`),
      );
      continue;
    }
    const offeredMa = offer.kind === 'fixed' || offer.kind === 'pps' || offer.kind === 'variable' ? offer.maxCurrentMa : undefined;
    if (entry.currentMa !== undefined && offeredMa !== undefined && Math.abs(offeredMa - entry.currentMa) >= 10) {
      findings.push(makeFinding('caps.label-mismatch', `The label says ${what} at ${a(entry.currentMa)}, but object ${index + 1} offers ${what} at ${a(offeredMa)}.`, { object: index + 1 }));
    }
  }
  if (powerW !== undefined && Math.round(powerW) !== pdpW) {
    findings.push(makeFinding('caps.label-mismatch', `The label says ${powerW} W, but the source's PDP is ${pdpW} W.`));
  }
  return findings;
}
