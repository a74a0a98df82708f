/**
 * The one way a bench script hands its figures to `npm run bench` (bench/all.ts). A script keeps
 * printing its own readable lines and, at its end, calls `report(benchName, figures)`: run alone
 * it prints nothing more; run by the runner (env PARLEY_BENCH_REPORT=1) it prints one line
 * `PARLEY_BENCH {json}` that the runner collects into the table.
 */

/** One measured size of a figure's input (e.g. 20k, 80k, 320k messages) and Parley's value there. */
export interface BenchPoint {
  size: string;
  value: number;
}

export interface BenchFigure {
  /** What is measured, e.g. "wire decode --json, peak memory at 640k messages". */
  figure: string;
  /** Unit of `parley` and `peer`, e.g. "ns/msg", "MB", "s", "msg/s". */
  unit: string;
  /** Parley's value. */
  parley: number;
  /** The floor or peer measured in the same run (read-and-parse, sigrok-cli, bare node, …). */
  peer?: number;
  /** What the peer is, e.g. "JSON.parse", "sigrok-cli". */
  peerName?: string;
  /** True when a larger value is better (throughput); default false (time, memory). */
  higherIsBetter?: boolean;
  /** Parley's value over three (or more) input sizes, smallest first. */
  growth?: BenchPoint[];
  /** The target in words, e.g. "≤ 0.5× JSON.parse", and whether this run met it. */
  target?: string;
  met?: boolean;
}

export interface BenchReport {
  bench: string;
  figures: BenchFigure[];
}

export const REPORT_ENV = 'PARLEY_BENCH_REPORT';
export const REPORT_MARKER = 'PARLEY_BENCH ';

/** Hands the figures to the runner (a no-op when the script runs on its own). */
export function report(bench: string, figures: BenchFigure[]): void {
  if (process.env[REPORT_ENV] !== '1') return;
  const payload: BenchReport = { bench, figures };
  process.stdout.write(`\n${REPORT_MARKER}${JSON.stringify(payload)}\n`);
}

/** Reads the reports a bench script printed (its other output is ignored). */
export function parseReports(stdout: string): BenchReport[] {
  const out: BenchReport[] = [];
  for (const line of stdout.split('\n')) {
    if (!line.startsWith(REPORT_MARKER)) continue;
    try {
      const parsed = JSON.parse(line.slice(REPORT_MARKER.length)) as BenchReport;
      if (typeof parsed.bench === 'string' && Array.isArray(parsed.figures)) out.push(parsed);
    } catch {
      // A truncated line: the runner reports the script as having given no figures.
    }
  }
  return out;
}

/** Parley ÷ peer, so that below 1 is better for times and memory, above 1 for throughput. */
export function ratioOf(figure: BenchFigure): number | undefined {
  if (figure.peer === undefined || !(figure.peer > 0)) return undefined;
  return figure.parley / figure.peer;
}

/** Peak resident memory of this process so far, in MB (Node's own high-water mark). */
export function peakRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}
