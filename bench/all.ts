/**
 * `npm run bench`: runs every `bench/*.bench.ts` in its own child process (one after another, so
 * they do not share the cores), collects the figures each hands to `report()` (bench/report.ts)
 * and prints one table: figure, Parley, its floor or peer measured in the same run, the ratio,
 * the growth over the input sizes, and the target. `npm run bench -- codec wire` runs the scripts
 * whose names contain one of the words. A script that fails is listed with its exit code.
 */
import { spawn } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { parseReports, ratioOf, REPORT_ENV, type BenchFigure, type BenchReport } from './report.ts';

const BENCH_DIR = import.meta.dirname;
const ROOT = join(BENCH_DIR, '..');
const verbose = process.argv.includes('--verbose');
const filters = process.argv.slice(2).filter((a) => !a.startsWith('--'));

const scripts = readdirSync(BENCH_DIR)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filters.length === 0 || filters.some((w) => f.includes(w)))
  .sort();

interface Outcome {
  script: string;
  code: number | null;
  seconds: number;
  reports: BenchReport[];
  tail: string;
}

function runScript(script: string): Promise<Outcome> {
  return new Promise((done) => {
    const start = performance.now();
    const child = spawn(process.execPath, ['--import', 'tsx', join(BENCH_DIR, script)], {
      cwd: ROOT,
      env: { ...process.env, [REPORT_ENV]: '1' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => {
      stdout += d.toString();
      if (verbose) process.stdout.write(d);
    });
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('close', (code) => {
      const tail = (stderr.trim() || stdout.trim()).split('\n').slice(-3).join(' | ');
      done({ script, code, seconds: (performance.now() - start) / 1000, reports: parseReports(stdout), tail });
    });
  });
}

/** Three significant figures, thousands separated. */
function num(value: number | undefined): string {
  if (value === undefined || !Number.isFinite(value)) return '–';
  const abs = Math.abs(value);
  const digits = abs >= 100 ? 0 : abs >= 10 ? 1 : 2;
  return value.toLocaleString('en-US', { maximumFractionDigits: digits, minimumFractionDigits: 0 });
}

function growthText(figure: BenchFigure): string {
  const points = figure.growth ?? [];
  if (points.length < 2) return '–';
  const first = points[0]!.value;
  const last = points[points.length - 1]!.value;
  const factor = first > 0 ? ` (${num(last / first)}×)` : '';
  return points.map((p) => `${p.size}: ${num(p.value)}`).join(' → ') + factor;
}

function row(bench: string, f: BenchFigure): string[] {
  const ratio = ratioOf(f);
  const target = f.target ? `${f.target} ${f.met === undefined ? '' : f.met ? 'met' : 'NOT met'}`.trim() : '';
  return [
    bench,
    f.figure,
    `${num(f.parley)} ${f.unit}`,
    f.peer === undefined ? '–' : `${num(f.peer)} ${f.unit} (${f.peerName ?? 'peer'})`,
    ratio === undefined ? '–' : `${num(ratio)}×`,
    growthText(f),
    target,
  ];
}

function table(rows: string[][]): string {
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  return rows
    .map((r, i) => {
      const line = r
        .map((cell, c) => cell.padEnd(widths[c]!))
        .join('  ')
        .trimEnd();
      return i === 0 ? `${line}\n${widths.map((w) => '-'.repeat(w)).join('  ')}` : line;
    })
    .join('\n');
}

const os = await import('node:os');
/** Load average over the last minute, 5 and 15 minutes: the table's figures depend on it. */
const loadText = () =>
  os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(', ');
const loadAtStart = loadText();
const startedAt = new Date().toISOString().slice(0, 16);

const outcomes: Outcome[] = [];
for (const script of scripts) {
  process.stdout.write(`running ${script} … `);
  const outcome = await runScript(script);
  process.stdout.write(`${outcome.code === 0 ? 'done' : `exit ${outcome.code}`} in ${outcome.seconds.toFixed(1)} s\n`);
  outcomes.push(outcome);
}

const rows = [['bench', 'figure', 'Parley', 'floor / peer (same run)', 'ratio', 'growth over input sizes', 'target']];
for (const o of outcomes) {
  for (const r of o.reports) for (const f of r.figures) rows.push(row(r.bench, f));
  if (o.reports.length === 0) rows.push([o.script, o.code === 0 ? 'no figures reported' : `failed (exit ${o.code}): ${o.tail.slice(0, 120)}`, '', '', '', '', '']);
}
console.log(`\n${table(rows)}`);
const cpus = os.cpus();
console.log(`\n${cpus[0]?.model.trim() ?? 'unknown CPU'}, ${cpus.length} cores, ${(os.totalmem() / 2 ** 30).toFixed(1)} GB, ${os.type()} ${os.release()}; Node ${process.version}`);
console.log(`measured ${startedAt}Z → ${new Date().toISOString().slice(0, 16)}Z; load average (1, 5, 15 min) ${loadAtStart} at the start, ${loadText()} at the end`);
const missed = outcomes.flatMap((o) => o.reports.flatMap((r) => r.figures)).filter((f) => f.met === false).length;
const failed = outcomes.filter((o) => o.code !== 0).length;
if (failed > 0 || missed > 0) console.log(`${failed} script(s) failed, ${missed} target(s) not met`);
