import { readFileSync } from 'node:fs';
import { analyzeTrace } from './shared/trace/index.ts';
for (const f of ['clean.txt', 'malformed.trace.jsonl']) {
  const r = analyzeTrace(readFileSync('tests/fixtures/traces/' + f, 'utf8'));
  if (!r.ok) { console.log(f, r.error); continue; }
  console.log('==', f, r.analysis.format, r.analysis.records, '\n  ', r.analysis.summary, JSON.stringify(r.analysis.contracts));
  for (const x of r.analysis.findings) console.log('   ', x.rule, x.t, x.line, '|', x.message);
}
