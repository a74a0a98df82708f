import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DECODE_RULES } from '../pd/index.ts';
import { isRuleId, makeFinding, ruleCatalog, ruleGroup, ruleIds, ruleTitle } from './catalog.ts';

const SHARED = join(import.meta.dirname, '..');
/**
 * The engine's own sources (tests excluded: they name made-up ids on purpose). `shared/api` is the
 * HTTP contract, not the engine: its error codes answer requests and never become findings.
 */
function engineSources(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name);
    if (e.isDirectory()) return path === join(SHARED, 'api') ? [] : engineSources(path);
    return e.name.endsWith('.ts') && !e.name.endsWith('.test.ts') ? [path] : [];
  });
}
/** A quoted string that is a whole rule-like id: 'caps.order', "decode.crc", `timing.ps-transition`. */
const QUOTED_ID = /['"`]((?:decode|caps|request|timing|protocol|epr|vbus|trace)\.[a-z0-9-]+)['"`]/g;
/**
 * Result error codes of the engine's edge (shared/core/result.ts): input errors, never findings, so
 * they have no rule page. A decode error code becomes a finding only when it is a catalog id
 * (shared/trace/analyser.ts); otherwise the analyser reports trace.malformed-line.
 */
const ERROR_CODES = new Set(['decode.chunk', 'decode.internal', 'trace.empty', 'trace.internal']);

// The fixed ids and severities of the contract's rule table (docs/rules.md).
const contractRules = new Map<string, string>([
  ['decode.length', 'error'],
  ['decode.reserved-type', 'warning'],
  ['decode.reserved-bits', 'warning'],
  ['decode.crc', 'error'],
  ['caps.first-not-vsafe5v', 'error'],
  ['caps.order', 'error'],
  ['caps.duplicate', 'error'],
  ['caps.power-rules-missing', 'error'],
  ['caps.power-rules-current', 'error'],
  ['caps.pps-range', 'warning'],
  ['caps.cable-current', 'info'],
  ['caps.label-mismatch', 'warning'],
  ['request.position', 'error'],
  ['request.exceeds-offer', 'error'],
  ['request.out-of-range', 'error'],
  ['timing.sender-response', 'error'],
  ['timing.ps-transition', 'error'],
  ['timing.pps-keepalive', 'error'],
  ['timing.caps-interval', 'warning'],
  ['protocol.missing-goodcrc', 'error'],
  ['protocol.message-id', 'error'],
  ['protocol.unexpected', 'error'],
  ['protocol.hard-reset', 'info'],
  ['protocol.soft-reset', 'info'],
  ['vbus.out-of-range', 'error'],
  ['vbus.over-current', 'warning'],
  ['trace.malformed-line', 'warning'],
  ['trace.time-order', 'error'],
  // Added in the second version.
  ['caps.cable-epr', 'info'],
  ['caps.revision', 'error'],
  ['request.epr-copy', 'error'],
  ['timing.receiver-response', 'warning'],
  ['timing.sink-request', 'error'],
  ['timing.epr-keepalive', 'error'],
  ['timing.hard-reset-recovery', 'error'],
  ['epr.entry', 'error'],
  ['protocol.collision', 'error'],
]);

describe('rule catalog', () => {
  it('has every rule id of rules.md with its severity', () => {
    for (const [id, severity] of contractRules) {
      expect(isRuleId(id), id).toBe(true);
      if (isRuleId(id)) expect(ruleCatalog[id].severity, id).toBe(severity);
    }
  });

  it('gives every entry a title, an explanation paragraph and a ref', () => {
    for (const id of ruleIds) {
      const entry = ruleCatalog[id];
      expect(entry.title.length, id).toBeGreaterThan(5);
      expect(entry.explanation.length, id).toBeGreaterThan(120);
      expect(entry.ref.length, id).toBeGreaterThan(5);
      expect(['decode', 'caps', 'request', 'timing', 'protocol', 'epr', 'vbus', 'trace']).toContain(ruleGroup(id));
    }
  });

  it('has every rule id the engine emits anywhere in shared/ (static scan of the sources)', () => {
    const seen = new Map<string, string>();
    for (const file of engineSources(SHARED)) {
      for (const match of readFileSync(file, 'utf8').matchAll(QUOTED_ID)) seen.set(match[1]!, file.slice(SHARED.length + 1));
    }
    expect(seen.size).toBeGreaterThan(30);
    const missing = [...seen].filter(([id]) => !isRuleId(id) && !ERROR_CODES.has(id)).map(([id, file]) => `${id} (${file})`);
    expect(missing).toEqual([]);
    // The error codes listed are still used, and none of them is a rule.
    for (const code of ERROR_CODES) {
      expect(seen.has(code), code).toBe(true);
      expect(isRuleId(code), code).toBe(false);
    }
  });

  it("mirrors the codec's own finding table (shared/pd/findings.ts) with the same severities", () => {
    for (const [id, entry] of Object.entries(DECODE_RULES)) {
      expect(isRuleId(id), id).toBe(true);
      if (isRuleId(id)) expect(ruleCatalog[id].severity, id).toBe(entry.severity);
    }
    expect(ruleCatalog['decode.rdo-unknown-type'].ref).toBe(DECODE_RULES['decode.rdo-unknown-type'].ref);
    expect(ruleCatalog['decode.object-position'].ref).toBe(DECODE_RULES['decode.object-position'].ref);
  });

  it('makes findings with the catalog severity and ref, keeping only given extras', () => {
    const finding = makeFinding('caps.order', 'Out of order.', { object: 3 });
    expect(finding).toEqual({ rule: 'caps.order', severity: 'error', message: 'Out of order.', ref: ruleCatalog['caps.order'].ref, object: 3 });
    expect(makeFinding('protocol.hard-reset', 'x', { t: 12, ref: 'custom' })).toEqual({ rule: 'protocol.hard-reset', severity: 'info', message: 'x', ref: 'custom', t: 12 });
    expect(isRuleId('caps.nothing')).toBe(false);
  });
});

describe('ruleTitle', () => {
  it("names a finding in the catalog's plain words, and keeps an unknown id as it is", () => {
    expect(ruleTitle('protocol.hard-reset')).toBe('Hard Reset');
    expect(ruleTitle('caps.pdp-inferred')).toBe('PDP inferred from the offers');
    expect(ruleTitle('vendor.something-new')).toBe('vendor.something-new');
  });
});
