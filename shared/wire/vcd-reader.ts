/**
 * A streaming reader of Value Change Dump files (IEEE 1364-2005 §18.2): header declarations up to
 * `$enddefinitions`, then `#time` stamps and value changes. It picks one 1-bit signal and reports
 * that signal's changes with their time in microseconds; chunks may split the text anywhere.
 */
import { fail, type Failure } from '../core/result.ts';
import { parseTimescaleUs } from './vcd-timescale.ts';

export type VcdValue = '0' | '1' | 'x' | 'z';

export interface VcdVar {
  type: string;
  width: number;
  id: string;
  ref: string;
  path: string;
}

export interface VcdReader {
  push(chunk: string): Failure | null;
  end(): Failure | null;
}

/** Longer than any VCD token (a huge vector value aside); bounds what a chunk boundary keeps. */
const MAX_TOKEN_CHARS = 1 << 20;
const SKIPPED_SECTIONS = new Set(['$date', '$version', '$comment']);
const BODY_KEYWORDS = new Set(['$dumpvars', '$dumpall', '$dumpon', '$dumpoff', '$end']);

export function createVcdReader(options: { signal?: string }, onChange: (tUs: number, value: VcdValue, line: number) => void): VcdReader {
  let carry = '';
  let line = 1;
  let carryLine = 1;
  let tokens = 0;
  let error: Failure | null = null;
  let inBody = false;
  let section: { keyword: string; line: number; words: string[] } | null = null;
  let vectorValue: string | null = null;
  let tickUs = 1e-3; // Common practice when `$timescale` is missing: 1 ns.
  let tUs = 0;
  let lastTicks = -1;
  const scopes: string[] = [];
  const vars: VcdVar[] = [];
  let chosen = '';

  function endSection(keyword: string, words: string[], at: number): void {
    if (keyword === '$timescale') {
      const parsed = parseTimescaleUs(words.join(' '));
      if (parsed === null) error = fail('vcd.timescale', `"$timescale ${words.join(' ')}" is not a timescale such as "1 ns" or "10 us"`, { line: at });
      else tickUs = parsed;
    } else if (keyword === '$scope') scopes.push(words[1] ?? '');
    else if (keyword === '$upscope') scopes.pop();
    else if (keyword === '$var') {
      const [type = '', size = '', id = '', ref = ''] = words;
      const width = Number(size);
      if (!id || !ref || !Number.isInteger(width)) error = fail('vcd.syntax', `"$var ${words.join(' ')}" needs a type, a width, an id and a name`, { line: at });
      else vars.push({ type, width, id, ref, path: [...scopes, ref].join('.') });
    } else if (keyword === '$enddefinitions') chooseSignal(at);
  }

  function chooseSignal(at: number): void {
    inBody = true;
    const wanted = options.signal;
    const named = wanted === undefined ? undefined : vars.find((v) => v.ref === wanted || v.path === wanted);
    if (wanted !== undefined && !named) {
      const names = vars
        .map((v) => v.path)
        .slice(0, 8)
        .join(', ');
      error = fail('vcd.signal', `no signal named "${wanted}" in this VCD (it has: ${names || 'none'})`, { line: at });
    } else if (named && named.width !== 1) {
      error = fail('vcd.signal', `signal "${wanted}" is ${named.width} bits wide; choose a 1-bit wire`, { line: at });
    } else {
      const picked = named ?? vars.find((v) => v.width === 1);
      if (!picked) error = fail('vcd.signal', 'this VCD declares no 1-bit signal to read as the CC wire', { line: at });
      else chosen = picked.id;
    }
  }

  function change(value: string, id: string, at: number): void {
    if (id !== chosen) return;
    const v = value.toLowerCase();
    onChange(tUs, v === '0' || v === '1' ? v : v === 'z' ? 'z' : 'x', at);
  }

  function token(word: string, at: number): void {
    tokens++;
    if (section) {
      if (word === '$end') {
        const done = section;
        section = null;
        endSection(done.keyword, done.words, done.line);
      } else section.words.push(word);
      return;
    }
    if (vectorValue !== null) {
      change(vectorValue.slice(-1), word, at);
      vectorValue = null;
      return;
    }
    const first = word[0]!;
    if (!inBody) {
      if (first !== '$') {
        error =
          tokens === 1
            ? fail('vcd.format', 'not a VCD file: it should open with a $ keyword such as $date, $timescale or $var', { line: at })
            : fail('vcd.syntax', `unexpected "${word.slice(0, 40)}" in the VCD header`, { line: at });
        return;
      }
      section = { keyword: word, line: at, words: [] };
      return;
    }
    if (first === '#') {
      const ticks = Number(word.slice(1));
      if (!Number.isFinite(ticks) || ticks < 0 || word.length < 2) error = fail('vcd.syntax', `"${word.slice(0, 40)}" is not a time stamp`, { line: at });
      else if (ticks < lastTicks) error = fail('vcd.time', `time goes backwards at "${word}"`, { line: at });
      else {
        lastTicks = ticks;
        tUs = ticks * tickUs;
      }
    } else if ('01xXzZ'.includes(first) && word.length > 1) change(first, word.slice(1), at);
    else if ('bBrR'.includes(first) && word.length > 1) vectorValue = first === 'r' || first === 'R' ? 'x' : word.slice(1);
    else if (SKIPPED_SECTIONS.has(word)) section = { keyword: word, line: at, words: [] };
    else if (!BODY_KEYWORDS.has(word)) error = fail('vcd.syntax', `unexpected "${word.slice(0, 40)}" in the value changes`, { line: at });
  }

  /** Runs the tokens of `text`; a token touching the end is kept for the next chunk unless `final`. */
  function scan(text: string, final: boolean): void {
    let i = 0;
    const n = text.length;
    while (i < n && !error) {
      let c = text.charCodeAt(i);
      while (i < n && (c === 32 || c === 9 || c === 10 || c === 13 || c === 12 || c === 11)) {
        if (c === 10) line++;
        c = text.charCodeAt(++i);
      }
      if (i >= n) break;
      const start = i;
      while (i < n && !(c === 32 || c === 9 || c === 10 || c === 13 || c === 12 || c === 11)) c = text.charCodeAt(++i);
      if (i >= n && !final) {
        if (n - start > MAX_TOKEN_CHARS) {
          error = fail('vcd.syntax', `a token of more than ${MAX_TOKEN_CHARS} characters: not a VCD`, { line });
          return;
        }
        carry = text.slice(start);
        carryLine = line;
        return;
      }
      token(text.slice(start, i), line);
    }
    carry = '';
  }

  return {
    push(chunk) {
      if (error) return error;
      const text = carry + chunk;
      line = carryLine;
      scan(text, false);
      carryLine = line;
      return error;
    },
    end() {
      if (error) return error;
      line = carryLine;
      scan(carry, true);
      if (error) return error;
      if (tokens === 0) return fail('vcd.empty', 'the VCD file is empty');
      if (section) return fail('vcd.syntax', `"${(section as { keyword: string }).keyword}" is not closed by $end`, { line: (section as { line: number }).line });
      if (!inBody) return fail('vcd.format', 'the VCD header has no $enddefinitions', { line });
      return null;
    },
  };
}
