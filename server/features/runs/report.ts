/**
 * Results CI posts: a JUnit XML file (any JUnit writer; `parley run --junit` writes one
 * testcase per vector with the id as its name) or the document `parley run --json` prints.
 * Both become the same list of results; bad input is a "field: message" error, never a crash.
 */
import { XMLParser } from 'fast-xml-parser';
import { z } from 'zod';
import { MAX_REPORT_CASES } from '../../../shared/api/index.ts';
import { zodMessage } from '../../../shared/core/zod-message.ts';
import { fail, type Result } from '../../../shared/core/result.ts';

export interface ReportedResult {
  id: string;
  ok: boolean;
  message?: string;
  durationMs: number;
}

export type ReportRead = Result<{ format: 'junit' | 'json'; results: ReportedResult[] }>;

const jsonReport = z.object({
  ok: z.boolean().optional(),
  passed: z.number().int().min(0).optional(),
  failed: z.number().int().min(0).optional(),
  results: z.array(z.object({ id: z.string().min(1).max(300), ok: z.boolean(), message: z.string().max(20_000).optional(), durationMs: z.number().min(0).optional() })).max(MAX_REPORT_CASES),
});

function asArray<T>(value: T | T[] | undefined): T[] {
  if (value === undefined) return [];
  return Array.isArray(value) ? value : [value];
}

type XmlNode = Record<string, unknown>;

function textOf(node: unknown): string {
  if (typeof node === 'string') return node;
  if (typeof node === 'number') return String(node);
  if (node && typeof node === 'object') {
    const n = node as XmlNode;
    const message = typeof n['@_message'] === 'string' ? n['@_message'] : '';
    const body = typeof n['#text'] === 'string' ? n['#text'] : '';
    if (message && body?.startsWith(message)) return body;
    return [message, body].filter((s) => s !== '').join('\n');
  }
  return '';
}

function caseId(testcase: XmlNode): string {
  const name = String(testcase['@_name'] ?? '').trim();
  const classname = String(testcase['@_classname'] ?? '').trim();
  // parley writes the full id as the name; other writers split a test into class and name.
  if (name.includes('/') || classname === '' || name.startsWith(`${classname}/`)) return name;
  return `${classname}.${name}`;
}

function suitesOf(root: XmlNode): XmlNode[] {
  const direct = asArray(root.testsuite as XmlNode | XmlNode[] | undefined);
  const nested = asArray(root.testsuites as XmlNode | XmlNode[] | undefined).flatMap((s) => suitesOf(s));
  return [...direct, ...nested, ...direct.flatMap((s) => suitesOf(s))];
}

export function readJunit(xml: string): ReportRead {
  let root: XmlNode;
  try {
    const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@_', processEntities: true, parseTagValue: false, parseAttributeValue: false });
    root = parser.parse(xml, true) as XmlNode;
  } catch (error) {
    return fail('run.bad-report', `file: not well-formed XML (${error instanceof Error ? error.message.split('\n')[0] : String(error)})`);
  }
  const suites = suitesOf(root);
  if (suites.length === 0) return fail('run.bad-report', 'file: no <testsuite> element; this is not a JUnit report');
  const results: ReportedResult[] = [];
  for (const suite of suites) {
    for (const testcase of asArray(suite.testcase as XmlNode | XmlNode[] | undefined)) {
      const id = caseId(testcase);
      if (id === '') return fail('run.bad-report', 'file: a <testcase> has no name');
      if (testcase.skipped !== undefined) continue;
      const failure = testcase.failure ?? testcase.error;
      const seconds = Number(testcase['@_time'] ?? 0);
      const durationMs = Number.isFinite(seconds) && seconds > 0 ? seconds * 1_000 : 0;
      if (failure === undefined) results.push({ id, ok: true, durationMs });
      else results.push({ id, ok: false, message: asArray(failure).map(textOf).join('\n').trim() || 'failed', durationMs });
      if (results.length > MAX_REPORT_CASES) return fail('run.bad-report', `file: more than ${MAX_REPORT_CASES} test cases`);
    }
  }
  if (results.length === 0) return fail('run.bad-report', 'file: the JUnit report holds no test cases');
  return { ok: true, format: 'junit', results };
}

export function readJsonReport(value: unknown): ReportRead {
  const parsed = jsonReport.safeParse(value);
  if (!parsed.success) {
    return fail('run.bad-report', zodMessage(parsed.error, { where: 'results', limit: 1 }));
  }
  if (parsed.data.results.length === 0) return fail('run.bad-report', 'results: the report holds no results');
  return { ok: true, format: 'json', results: parsed.data.results.map((r) => ({ id: r.id, ok: r.ok, message: r.message, durationMs: r.durationMs ?? 0 })) };
}

/** A posted file: JSON when it starts with `{`, else JUnit XML. */
export function readReportText(text: string): ReportRead {
  const trimmed = text.replace(/^\uFEFF/, '').trimStart();
  if (trimmed.startsWith('{')) {
    try {
      return readJsonReport(JSON.parse(trimmed));
    } catch (error) {
      return fail('run.bad-report', `file: not valid JSON (${error instanceof Error ? error.message : String(error)})`);
    }
  }
  if (trimmed.startsWith('<')) return readJunit(trimmed);
  return fail('run.bad-report', 'file: neither JUnit XML nor a parley run --json result');
}
