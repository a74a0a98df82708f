import { negotiation } from './tests/fixtures/traces/build.ts';
import { analyzeRecords } from './shared/trace/index.ts';
for (const g of [{ request: 30_370, r20: true }, { request: 30_370 }, { psRdy: 559_503 }, {accept: 40_000}]) {
  const a = analyzeRecords(negotiation(g).records);
  console.log(JSON.stringify(g), a.summary, a.findings.filter(f => f.severity !== 'info').map(f => f.message));
}
