/**
 * Line-oriented logs in the shape a team's firmware prints them, read through an import mapping:
 * which column (or which named group of a pattern) holds the time and in what unit, which holds
 * the direction and which words mean source, sink or cable, and where the message is, as hex
 * bytes in wire order or as words (a 16-bit header, then 32-bit data objects, each as printed,
 * most significant digit first; USB PD R3.2 V1.1 §6.2.1: the wire carries each little-endian).
 * The output is trace.md's message records, so everything else (the analyser, the timeline) reads
 * a mapped log exactly as a JSON Lines trace. Pure: no I/O.
 */
import { z } from 'zod';
import { fail, type Result } from '../core/result.ts';
import type { MessageRecord, TraceSide } from './records.ts';

export const TIME_UNITS_US = { s: 1_000_000, ms: 1_000, us: 1, ns: 0.001 } as const;

const columnIndex = z.number().int().min(1).max(64).describe('1 = the first column');

export const textMappingSchema = z
  .object({
    name: z.string().trim().min(1).max(80),
    /** `columns`: split each line at the separator; `pattern`: a regular expression with named groups `time`, `dir`, `data`. */
    mode: z.enum(['columns', 'pattern']),
    separator: z.enum(['whitespace', ',', ';', 'tab', '|']).default('whitespace'),
    timeColumn: columnIndex.optional(),
    directionColumn: columnIndex.optional(),
    /** The message starts in this column and runs to the end of the line. */
    dataColumn: columnIndex.optional(),
    pattern: z.string().max(500).optional(),
    timeUnit: z.enum(['s', 'ms', 'us', 'ns']),
    data: z.enum(['bytes', 'words']),
    sourceWords: z.array(z.string().trim().min(1).max(20)).min(1).max(8),
    sinkWords: z.array(z.string().trim().min(1).max(20)).min(1).max(8),
    cableWords: z.array(z.string().trim().min(1).max(20)).max(8).default([]),
    /** Lines starting with this are comments (e.g. "#"). */
    commentPrefix: z.string().max(4).default(''),
  })
  .superRefine((m, ctx) => {
    if (m.mode === 'columns') {
      for (const key of ['timeColumn', 'directionColumn', 'dataColumn'] as const) if (m[key] === undefined) ctx.addIssue({ code: 'custom', path: [key], message: 'needed when reading columns' });
    } else if (!m.pattern) ctx.addIssue({ code: 'custom', path: ['pattern'], message: 'needed when reading with a pattern' });
    else {
      const compiled = compilePattern(m.pattern);
      if (!compiled.ok) ctx.addIssue({ code: 'custom', path: ['pattern'], message: compiled.error.message });
    }
  });

export type TextMapping = z.output<typeof textMappingSchema>;
export type TextMappingInput = z.input<typeof textMappingSchema>;

export type MappedRead = { records: MessageRecord[]; skipped: { line: number; reason: string }[] };

function compilePattern(pattern: string): Result<{ regex: RegExp }> {
  let regex: RegExp;
  try {
    regex = new RegExp(pattern);
  } catch (error) {
    return fail('mapping.pattern', `not a regular expression: ${error instanceof Error ? error.message : String(error)}`);
  }
  const groups = ['time', 'dir', 'data'].filter((name) => !pattern.includes(`(?<${name}>`));
  if (groups.length > 0) return fail('mapping.pattern', `the pattern needs the named groups ${groups.map((g) => `(?<${g}>…)`).join(', ')}`);
  return { ok: true, regex };
}

const SEPARATORS: Record<TextMapping['separator'], RegExp> = { whitespace: /\s+/, ',': /\s*,\s*/, ';': /\s*;\s*/, tab: /\t/, '|': /\s*\|\s*/ };

/** The message's wire-order hex from the data field, or why it cannot be read. */
export function wireHexOf(field: string, data: TextMapping['data']): Result<{ hex: string }> {
  const tokens = field
    .trim()
    .split(/[\s,:]+/)
    .filter(Boolean)
    .map((t) => t.replace(/^0x/i, ''));
  if (tokens.length === 0) return fail('mapping.data', 'no message on the line');
  if (tokens.some((t) => !/^[0-9a-f]+$/i.test(t))) return fail('mapping.data', `not hex: "${tokens.find((t) => !/^[0-9a-f]+$/i.test(t))}"`);
  if (data === 'bytes') {
    const joined = tokens.join('');
    if (joined.length % 2 !== 0 || joined.length < 4) return fail('mapping.data', 'hex bytes must be whole bytes, at least the 2-byte header');
    return { ok: true, hex: joined.toLowerCase() };
  }
  const [header, ...objects] = tokens;
  if (header!.length > 4) return fail('mapping.data', `the header word "${header}" is longer than 16 bits`);
  if (objects.some((o) => o.length > 8)) return fail('mapping.data', 'a data object is longer than 32 bits');
  const le = (word: string, bytes: number) => {
    const padded = word.padStart(bytes * 2, '0');
    let out = '';
    for (let index = bytes - 1; index >= 0; index--) out += padded.slice(index * 2, index * 2 + 2);
    return out;
  };
  return { ok: true, hex: (le(header!, 2) + objects.map((o) => le(o, 4)).join('')).toLowerCase() };
}

/** Reads every line that holds a message; other lines are listed as skipped with the reason (never fatal). */
export function readMappedText(text: string, mapping: TextMapping): Result<MappedRead> {
  const pattern = mapping.mode === 'pattern' ? compilePattern(mapping.pattern ?? '') : null;
  if (pattern && !pattern.ok) return pattern;
  const sides = new Map<string, TraceSide>();
  for (const word of mapping.sourceWords) sides.set(word.toLowerCase(), 'source');
  for (const word of mapping.sinkWords) sides.set(word.toLowerCase(), 'sink');
  for (const word of mapping.cableWords) sides.set(word.toLowerCase(), 'cable');
  const records: MessageRecord[] = [];
  const skipped: MappedRead['skipped'] = [];
  const lines = text.split(/\r?\n/);
  let lastT = 0;
  for (let index = 0; index < lines.length; index++) {
    const line = lines[index]!;
    const lineNo = index + 1;
    if (line.trim() === '' || (mapping.commentPrefix && line.trimStart().startsWith(mapping.commentPrefix))) continue;
    let timeText: string | undefined;
    let dirText: string | undefined;
    let dataText: string | undefined;
    if (pattern) {
      const match = pattern.regex.exec(line);
      if (!match?.groups) {
        skipped.push({ line: lineNo, reason: 'the pattern does not match' });
        continue;
      }
      ({ time: timeText, dir: dirText, data: dataText } = match.groups);
    } else {
      const cells = line.trim().split(SEPARATORS[mapping.separator]);
      timeText = cells[mapping.timeColumn! - 1];
      dirText = cells[mapping.directionColumn! - 1];
      dataText = cells.slice(mapping.dataColumn! - 1).join(' ');
    }
    const value = Number((timeText ?? '').trim());
    if (!timeText || !Number.isFinite(value) || value < 0) {
      skipped.push({ line: lineNo, reason: `no time: "${(timeText ?? '').slice(0, 30)}"` });
      continue;
    }
    const t = Math.round(value * TIME_UNITS_US[mapping.timeUnit]);
    if (t < lastT) {
      skipped.push({ line: lineNo, reason: 'time goes backwards' });
      continue;
    }
    const from = sides.get((dirText ?? '').trim().toLowerCase());
    if (!from) {
      skipped.push({ line: lineNo, reason: `direction "${(dirText ?? '').trim().slice(0, 20)}" is not one of the mapping's words` });
      continue;
    }
    const hex = wireHexOf(dataText ?? '', mapping.data);
    if (!hex.ok) {
      skipped.push({ line: lineNo, reason: hex.error.message });
      continue;
    }
    lastT = t;
    records.push({ t, msg: hex.hex, from });
  }
  if (records.length === 0) return fail('mapping.empty', `no line could be read with the mapping "${mapping.name}"${skipped[0] ? ` (line ${skipped[0].line}: ${skipped[0].reason})` : ''}`);
  return { ok: true, records, skipped };
}

/** The mapped log as a JSON Lines trace (trace.md): a header naming the mapping, then one record a line. */
export function mappedTextToJsonl(text: string, mapping: TextMapping, title: string): Result<{ jsonl: string; messages: number; skipped: MappedRead['skipped'] }> {
  const read = readMappedText(text, mapping);
  if (!read.ok) return read;
  const head = JSON.stringify({ trace: 1, title, importedWith: mapping.name });
  return { ok: true, jsonl: [head, ...read.records.map((r) => JSON.stringify(r))].join('\n') + '\n', messages: read.records.length, skipped: read.skipped };
}
