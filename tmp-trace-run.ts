import { readFileSync, readdirSync } from 'node:fs';
import { analyzeTrace } from './shared/trace/index.ts';
for (const f of readdirSync('tests/fixtures/traces').sort()) {
  const r = analyzeTrace(readFileSync('tests/fixtures/traces/' + f, 'utf8'));
  if (!r.ok) { console.log(f, r.error); continue; }
  console.log('==', f, '\n  ', r.analysis.summary);
  for (const x of r.analysis.findings) console.log('   ', x.rule, x.t, '|', x.message);
}
