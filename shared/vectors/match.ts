/**
 * Partial matching of a vector's `expect` against the actual output (docs/vector.md):
 * - every key given under `expect` must be equal in the actual output; keys the actual output has
 *   beyond them are ignored;
 * - arrays match element by element by index (an expected element that the actual array lacks is
 *   a mismatch; actual elements beyond the expected ones are ignored, like extra keys);
 * - `findings: { include, exclude }` matches a list of findings by rule id; `"*error"` in
 *   `exclude` means no finding of severity `error` at all;
 * - scalars compare with `===` (numbers are integers, so there is no tolerance).
 * Kind-specific keys (`sequence`, `contractWithinMs`) are matched by the runner with
 * `matchSequence` / `matchWithin` below, which report in the same shape.
 */
import type { Finding } from '../core/finding.ts';

export interface Mismatch {
  /** Dotted path from `expect`, e.g. `expect.message.header.messageType`, `expect.message.objects[0].voltageMv`. */
  path: string;
  expected: unknown;
  actual: unknown;
  /** The readable line: `path: expected …, got …`. */
  message: string;
}

export interface FindingsExpectation {
  include?: string[];
  exclude?: string[];
}

const MAX_VALUE_CHARS = 120;

/** JSON for people, cut short when long. */
export function show(value: unknown): string {
  if (value === undefined) return 'nothing';
  const text = JSON.stringify(value) ?? String(value);
  return text.length > MAX_VALUE_CHARS ? `${text.slice(0, MAX_VALUE_CHARS - 1)}…` : text;
}

function mismatch(path: string, expected: unknown, actual: unknown, message?: string): Mismatch {
  return { path, expected, actual, message: message ?? `${path}: expected ${show(expected)}, got ${show(actual)}` };
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Partial deep match; appends every mismatch found under `path`. */
export function matchPartial(expected: unknown, actual: unknown, path: string, out: Mismatch[] = []): Mismatch[] {
  if (Array.isArray(expected)) {
    if (!Array.isArray(actual)) {
      out.push(mismatch(path, expected, actual));
      return out;
    }
    expected.forEach((item, index) => {
      const at = `${path}[${index}]`;
      if (index >= actual.length) out.push(mismatch(at, item, undefined, `${at}: expected ${show(item)}, got nothing (only ${actual.length} elements)`));
      else matchPartial(item, actual[index], at, out);
    });
    return out;
  }
  if (isRecord(expected)) {
    if (!isRecord(actual)) {
      out.push(mismatch(path, expected, actual));
      return out;
    }
    for (const [key, value] of Object.entries(expected)) matchPartial(value, actual[key], `${path}.${key}`, out);
    return out;
  }
  if (expected !== actual) out.push(mismatch(path, expected, actual));
  return out;
}

/** `findings.include` / `findings.exclude` against the actual findings. */
export function matchFindings(expected: FindingsExpectation, actual: readonly Finding[], path = 'expect.findings'): Mismatch[] {
  const out: Mismatch[] = [];
  const fired = [...new Set(actual.map((f) => f.rule))];
  for (const rule of expected.include ?? []) {
    if (rule === '*error') {
      if (!actual.some((f) => f.severity === 'error')) out.push(mismatch(`${path}.include`, rule, fired, `${path}.include: expected a finding of severity error, got ${show(fired)}`));
    } else if (!fired.includes(rule)) {
      out.push(mismatch(`${path}.include`, rule, fired, `${path}.include: expected rule "${rule}" to fire, got ${show(fired)}`));
    }
  }
  for (const rule of expected.exclude ?? []) {
    const hits = rule === '*error' ? actual.filter((f) => f.severity === 'error') : actual.filter((f) => f.rule === rule);
    const first = hits[0];
    if (first) {
      const what = rule === '*error' ? `no finding of severity error, got "${first.rule}"` : `rule "${rule}" not to fire, got it`;
      out.push(
        mismatch(
          `${path}.exclude`,
          rule,
          hits.map((f) => f.rule),
          `${path}.exclude: expected ${what}: ${first.message}`,
        ),
      );
    }
  }
  return out;
}

/** `sequence`: the names must appear in this order; other names may come between. */
export function matchSequence(expected: readonly string[], actual: readonly string[], path = 'expect.sequence'): Mismatch[] {
  let at = 0;
  for (const [index, name] of expected.entries()) {
    const found = actual.indexOf(name, at);
    if (found < 0) {
      const after = index === 0 ? '' : ` after "${expected[index - 1]}"`;
      return [mismatch(`${path}[${index}]`, name, actual, `${path}[${index}]: expected "${name}"${after}, got ${show(actual.slice(at))}`)];
    }
    at = found + 1;
  }
  return [];
}

/** `contractWithinMs`: a contract must exist and be reached no later than the bound. */
export function matchWithin(boundMs: number, actualMs: number | null, path = 'expect.contractWithinMs'): Mismatch[] {
  if (actualMs === null) return [mismatch(path, boundMs, null, `${path}: expected a contract within ${boundMs} ms, got no contract`)];
  if (actualMs > boundMs) return [mismatch(path, boundMs, actualMs, `${path}: expected a contract within ${boundMs} ms, got one at ${actualMs} ms`)];
  return [];
}

/** One readable message for a list of mismatches: the first, and how many more. */
export function describeMismatches(mismatches: readonly Mismatch[]): string | undefined {
  const [first, ...rest] = mismatches;
  if (!first) return undefined;
  return rest.length === 0 ? first.message : `${first.message} (and ${rest.length} more: ${rest.map((m) => m.path).join(', ')})`;
}
