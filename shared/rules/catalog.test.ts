import { describe, expect, it } from 'vitest';
import { isRuleId, makeFinding, ruleCatalog, ruleGroup, ruleIds } from './catalog.ts';

// The fixed ids and severities of the contract's rule table (../shared/contract/rules.md).
const contractRules = new Map<string, string>([
  ['decode.length', 'error'], ['decode.reserved-type', 'warning'], ['decode.reserved-bits', 'warning'], ['decode.crc', 'error'],
  ['caps.first-not-vsafe5v', 'error'], ['caps.order', 'error'], ['caps.duplicate', 'error'], ['caps.power-rules-missing', 'error'],
  ['caps.power-rules-current', 'error'], ['caps.pps-range', 'warning'], ['caps.cable-current', 'info'], ['caps.label-mismatch', 'warning'],
  ['request.position', 'error'], ['request.exceeds-offer', 'error'], ['request.out-of-range', 'error'],
  ['timing.sender-response', 'error'], ['timing.ps-transition', 'error'], ['timing.pps-keepalive', 'error'], ['timing.caps-interval', 'warning'],
  ['protocol.missing-goodcrc', 'error'], ['protocol.message-id', 'error'], ['protocol.unexpected', 'error'], ['protocol.hard-reset', 'info'],
  ['protocol.soft-reset', 'info'], ['vbus.out-of-range', 'error'], ['vbus.over-current', 'warning'], ['trace.malformed-line', 'warning'],
  ['trace.time-order', 'error'],
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
      expect(['decode', 'caps', 'request', 'timing', 'protocol', 'vbus', 'trace']).toContain(ruleGroup(id));
    }
  });

  it('makes findings with the catalog severity and ref, keeping only given extras', () => {
    const finding = makeFinding('caps.order', 'Out of order.', { object: 3 });
    expect(finding).toEqual({ rule: 'caps.order', severity: 'error', message: 'Out of order.', ref: ruleCatalog['caps.order'].ref, object: 3 });
    expect(makeFinding('protocol.hard-reset', 'x', { t: 12, ref: 'custom' })).toEqual({ rule: 'protocol.hard-reset', severity: 'info', message: 'x', ref: 'custom', t: 12 });
    expect(isRuleId('caps.nothing')).toBe(false);
  });
});
