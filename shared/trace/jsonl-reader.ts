/**
 * The JSON Lines reader (docs/trace.md, "JSON Lines"): a header object first, then one
 * record a line; blank lines are ignored; a line that is not JSON, or no known record, goes to the
 * sink as malformed and reading goes on.
 */
import { createLineSplitter } from './lines.ts';
import { checkRecord } from './records.ts';
import type { TraceReader, TraceSink } from './sink.ts';

export function createJsonlReader(sink: TraceSink): TraceReader {
  const splitter = createLineSplitter((line, lineNo) => readJsonlLine(line, lineNo, sink));
  return {
    push: (chunk) => splitter.push(chunk),
    end() {
      splitter.end();
      return { ok: true };
    },
  };
}

/** One line: a record, the header, nothing (blank) or a malformed line. */
export function readJsonlLine(line: string, lineNo: number, sink: TraceSink): void {
  let text = line;
  if (lineNo === 1 && text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    if (text.trim() === '') return;
    sink.malformed(lineNo, 'not valid JSON');
    return;
  }
  const checked = checkRecord(value);
  if (checked.kind === 'record') sink.push(checked.record, lineNo);
  else if (checked.kind === 'header') sink.header?.(checked.header, lineNo);
  else sink.malformed(lineNo, checked.reason);
}
