import { useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { busEventsOf, chartEventsOf } from '../../../components/timeline/event-lane.tsx';
import { EVENT_COLOURS, PIN_COLOURS } from '../../../components/timeline/vbus-chart.tsx';
import { EXPORT_HEADER_PX, svgMarkup, pngOfSvg, type LegendEntry } from '../lib/chart-image.ts';
import { downloadBlob, downloadText } from '../../../lib/download.ts';
import { traceJsonl, vectorFromRun, vectorIdOf } from '../lib/run-exports.ts';
import { samplesCsv } from '../lib/samples.ts';
import type { BenchRun } from '../lib/use-simulation.ts';

const FAULT_ENTRY: LegendEntry = { label: 'fault injected', colour: EVENT_COLOURS.fault };
const LEGEND: readonly LegendEntry[] = [
  { label: 'VBUS at the source (V)', colour: '#d97706' },
  { label: 'VBUS at the sink (V)', colour: '#7c3aed', dash: '4 2' },
  { label: 'IBUS (A)', colour: '#0284c7' },
  { label: 'reset', colour: EVENT_COLOURS.reset },
  { label: 'attach', colour: EVENT_COLOURS.attach },
  { label: 'finding', colour: PIN_COLOURS.error, dash: '4 3' },
];

/** The picture's legend: 'fault injected' only when the run had a fault to draw, as on screen. */
function legendOf(run: BenchRun): readonly LegendEntry[] {
  const faulted = chartEventsOf(busEventsOf(run.events)).some((event) => event.tone === 'fault');
  return faulted ? [...LEGEND.slice(0, -1), FAULT_ENTRY, ...LEGEND.slice(-1)] : LEGEND;
}

export type ExportPanelProps = {
  run: BenchRun;
  /** The scenario's title: the picture's heading and the default name of files and vectors. */
  title: string;
  /** The chart's <svg>, found when an image is asked for. */
  chartSvg(): SVGSVGElement | null;
  dark: boolean;
};

function stamp(iso: string): string {
  return iso.replace(/[:]/g, '').replace(/\..*$/, '').replace('T', '-');
}

/** Files from the finished run: trace, samples, chart, and the run as a negotiation vector. */
export function ExportPanel({ run, title, chartSvg, dark }: ExportPanelProps) {
  const name = title;
  const [problem, setProblem] = useState<string | null>(null);
  const base = `bench-${stamp(run.finishedAt)}`;
  const id = vectorIdOf(name);

  const chartImage = async (kind: 'svg' | 'png') => {
    setProblem(null);
    const svg = chartSvg();
    if (!svg) {
      setProblem('The chart is not on screen yet.');
      return;
    }
    const markup = svgMarkup(svg, { background: dark ? '#0f172a' : '#ffffff', title: `${name} — VBUS and IBUS`, legend: legendOf(run), textColour: dark ? '#e2e8f0' : '#0f172a' });
    if (kind === 'svg') {
      downloadText(`${base}.chart.svg`, markup, 'image/svg+xml');
      return;
    }
    try {
      const { width, height } = svg.getBoundingClientRect();
      downloadBlob(`${base}.chart.png`, await pngOfSvg(markup, width, height + EXPORT_HEADER_PX));
    } catch (error) {
      setProblem(error instanceof Error ? error.message : String(error));
    }
  };

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap gap-2">
        <Button
          variant="secondary"
          size="sm"
          onClick={() =>
            downloadText(`${base}.trace.jsonl`, traceJsonl(run.events, { title: `Bench run: ${name}`, seed: run.scenario.seed ?? 1, simulatedAt: run.finishedAt }), 'application/x-ndjson')
          }
        >
          Trace (.trace.jsonl)
        </Button>
        <Button variant="secondary" size="sm" disabled={run.samples.count === 0} onClick={() => downloadText(`${base}.samples.csv`, samplesCsv(run.samples), 'text/csv')}>
          Samples (.csv)
        </Button>
        <Button variant="secondary" size="sm" onClick={() => void chartImage('svg')}>
          Chart (.svg)
        </Button>
        <Button variant="secondary" size="sm" onClick={() => void chartImage('png')}>
          Chart (.png)
        </Button>
      </div>
      <div className="flex flex-wrap items-center gap-2 border-t border-slate-200 pt-4 dark:border-slate-800">
        <Button
          variant="secondary"
          size="sm"
          onClick={() => downloadText(`${id.split('/').pop()}.vector.json`, vectorFromRun(run.scenario, run, { id, title: name.trim() || 'Bench scenario', tags: ['bench'] }), 'application/json')}
        >
          Download as vector (.vector.json)
        </Button>
        <span className="font-mono text-xs text-slate-500">{id}</span>
      </div>
      <p className="text-xs text-slate-500 dark:text-slate-400">
        The vector expects this run’s contract, its key messages in order, and {run.findings.some((finding) => finding.severity === 'error') ? 'its error findings' : 'no error findings'}. Check each
        expectation against the specification before adding it to the library.
      </p>
      {problem && (
        <p role="alert" className="text-xs text-red-600 dark:text-red-400">
          {problem}
        </p>
      )}
    </div>
  );
}
