/**
 * The sentence a support engineer pastes first, for every demo trace: one reading of the trace,
 * the most likely cause and the side it points at. The causes follow from each scenario
 * (scenarios.ts) and the specification's timers (USB PD R3.2 V1.1 Time Values table): a late
 * Request (tSenderResponse), a late PS_RDY (tPSTransition), PPS re-requests that stop (tPPSRequest),
 * VBUS below the fixed contract's 95 % (§7.1.x), a Request the source never acknowledged (§6.7.2).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyseTrace } from '../../../shared/trace/index.ts';
import { demoTraceFolder, readDemoManifest } from './manifest.ts';

const expected: Record<string, string> = {
  'k65-wren14-bench.trace.jsonl': 'Contract 20 V 3.25 A at 0.418 s; no errors or warnings.',
  'wren14-late-request.txt': 'Contract 20 V 3.25 A at 0.454 s; 1 error; likely cause: response came too late at 0.215 s, which points at the device (sink).',
  'k65-late-ps-rdy.trace.jsonl': 'Contract 15 V 3 A at 0.908 s; 1 error; likely cause: PS_RDY came too late at 0.738 s, which points at the adapter (source).',
  'k65-pps-stops.trace.jsonl':
    'Contract PPS 9 V 2 A at 0.338 s; 2 contracts in all, the last PPS 9 V 2 A at 22.908 s; Hard Reset at 21.1 s; 1 error; likely cause of the Hard Reset: the sink stopped re-requesting its programmable contract, which points at the device (sink).',
  'd100-vbus-sag.trace.jsonl': "Contract 20 V 3.25 A at 0.418 s; 1 error; likely cause: VBUS outside the contract's tolerance at 6.25 s, which points at the adapter (source).",
  'wren14-missing-goodcrc.txt':
    "Hard Reset at 0.213 s, then contract 20 V 3.25 A at 2.12 s; 1 error; likely cause of the Hard Reset: the sink's Request at 0.184 s got no GoodCRC, which points at the adapter (source).",
};

describe('the summary sentence of every demo trace', () => {
  it('covers every demo trace', () => {
    expect(
      readDemoManifest()
        .map((e) => e.fileName)
        .sort(),
    ).toEqual(Object.keys(expected).sort());
  });
  for (const [file, sentence] of Object.entries(expected)) {
    it(file, () => {
      const result = analyseTrace(readFileSync(join(demoTraceFolder, file), 'utf8'));
      expect(result.ok && result.analysis.summary).toBe(sentence);
    });
  }
});
