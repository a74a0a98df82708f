import { readFileSync } from 'node:fs';
import { analyzeTrace } from './shared/trace/index.ts';
for (const f of ['k65-pps-stops.trace.jsonl','k65-late-ps-rdy.trace.jsonl','d100-vbus-sag.trace.jsonl','k65-wren14-bench.trace.jsonl','wren14-late-request.txt','wren14-missing-goodcrc.txt']) {
const r = analyzeTrace(readFileSync('server/db/demo-traces/'+f,'utf8'));
if (r.ok) { console.log('==', f, '\n', r.analysis.summary); for (const x of r.analysis.findings) console.log('  ', x.severity, x.rule, x.message); }
}
