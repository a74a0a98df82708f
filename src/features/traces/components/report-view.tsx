// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { useMemo } from 'react';
import type { Finding } from '../../../../shared/core/finding.ts';
import { ruleTitle } from '../../../../shared/rules/catalog.ts';
import type { Analysis } from '../../../../shared/api/index.ts';
import { ParleyMark } from '../../../components/parley-mark.tsx';
import { chartEventsOf } from '../../../components/timeline/event-lane.tsx';
import { chartPinsOf } from '../../../components/timeline/finding-pins.tsx';
import { formatTimeUs } from '../../../components/timeline/time-window.ts';
import { PLOT_INSET_LEFT_PX, VbusChart } from '../../../components/timeline/vbus-chart.tsx';
import { TimelineLegend } from '../../../components/timeline/timeline-legend.tsx';
import type { LaneMessage } from '../../../components/timeline/message-lanes.tsx';
import { countsText, SEVERITY_WORD } from '../../../lib/plural.ts';
import { contractLabel, formatPower, formatSeconds } from '../lib/format.ts';
import { timelineInputOfAnalysis } from '../lib/timeline-input.ts';

export type ReportData = {
  title: string;
  /** Lines under the title: device, customer reference, file, who uploaded it when. */
  about: string[];
  summary: string;
  messages: number;
  counts: Analysis['counts'];
  contracts: Analysis['contracts'];
  findings: readonly (Finding & { title?: string })[];
  findingsOmitted: number;
  timeline: Pick<Analysis['timeline'], 'messages' | 'measurements' | 'events' | 'contracts' | 'omitted' | 'measurementStride'>;
  notes?: string;
  /** A line at the top (e.g. "Shared read-only until 2026-12-18"). */
  banner?: string;
};

/** Messages listed around each finding: this many before and after its time. */
const AROUND = 3;
/** Findings shown with their messages (the rest are listed in the table only). */
const WITH_MESSAGES = 12;

function messagesAround(messages: readonly LaneMessage[], tUs: number): LaneMessage[] {
  const shown = messages.filter((m) => m.messageType !== 'GoodCRC');
  let index = shown.findIndex((m) => m.t >= tUs);
  if (index === -1) index = shown.length;
  return shown.slice(Math.max(0, index - AROUND), index + AROUND);
}

const nothing = () => undefined;

/**
 * The customer-ready diagnosis: the one-sentence summary, the contracts, the chart of the whole
 * trace with its events and findings, every finding in plain words with the messages around it.
 * No comments of the team; printable, with page breaks between rows and sections, never inside.
 */
export function ReportView({ data }: { data: ReportData }) {
  const input = useMemo(() => timelineInputOfAnalysis({ timeline: data.timeline, findings: data.findings } as unknown as Analysis), [data]);
  const pins = useMemo(() => chartPinsOf(data.findings), [data.findings]);
  const events = useMemo(() => chartEventsOf(input.events), [input.events]);
  const whole = useMemo(() => ({ startUs: 0, endUs: input.endUs }), [input.endUs]);
  const timed = data.findings.filter((f) => f.t !== undefined).slice(0, WITH_MESSAGES);

  return (
    <article className="trace-report mx-auto max-w-4xl bg-white px-8 py-8 text-slate-900" data-testid="trace-report">
      {data.banner && <p className="no-print mb-4 rounded-md bg-sky-50 px-3 py-2 text-sm text-sky-900">{data.banner}</p>}
      <header className="mb-6 flex items-start justify-between gap-4 border-b-2 border-slate-900 pb-4">
        <div>
          <p className="font-mono text-[11px] tracking-widest text-slate-500 uppercase">Parley · trace diagnosis</p>
          <h1 className="text-2xl font-semibold">{data.title}</h1>
          {data.about.map((line) => (
            <p key={line} className="text-sm text-slate-600">
              {line}
            </p>
          ))}
        </div>
        <div className="flex flex-col items-end gap-2">
          <ParleyMark className="size-9" />
          <button type="button" onClick={() => window.print()} className="no-print rounded-md bg-amber-500 px-3 py-1.5 text-sm font-medium text-slate-950 hover:bg-amber-400">
            Print
          </button>
        </div>
      </header>

      <section className="report-section mb-6">
        <h2 className="mb-1 text-base font-semibold">Diagnosis</h2>
        <p className="text-[15px]" data-testid="report-summary">
          {data.summary}
        </p>
        <p className="mt-1 text-sm text-slate-600">{countsText(data.messages, data.counts)}</p>
        {data.notes && <p className="mt-2 text-sm whitespace-pre-wrap">Reported problem: {data.notes}</p>}
      </section>

      <section className="report-section mb-6">
        <h2 className="mb-1 text-base font-semibold">Contracts</h2>
        {data.contracts.length === 0 ? (
          <p className="text-sm">No contract was reached: the source and the sink never finished a negotiation.</p>
        ) : (
          <table>
            <thead>
              <tr>
                <th>From</th>
                <th>Contract</th>
                <th>Kind</th>
                <th>Object</th>
                <th>Power</th>
              </tr>
            </thead>
            <tbody>
              {data.contracts.slice(0, 200).map((c, index) => (
                <tr key={index}>
                  <td className="font-mono">{formatSeconds(c.t)}</td>
                  <td>{contractLabel(c)}</td>
                  <td>{c.kind}</td>
                  <td>{c.objectPosition}</td>
                  <td>{formatPower(c.powerMw)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {data.contracts.length > 200 && <p className="mt-1 text-xs">The first 200 of {data.contracts.length} contracts are listed.</p>}
      </section>

      {input.measurements.length > 0 && (
        <section className="report-section report-chart mb-6" aria-label="Chart">
          <h2 className="mb-1 text-base font-semibold">VBUS and IBUS over the whole capture</h2>
          <VbusChart measurements={input.measurements} window={whole} endUs={input.endUs} pins={pins} events={events} bands={input.bands} onWindowChange={nothing} />
          <div style={{ paddingLeft: PLOT_INSET_LEFT_PX }} className="mt-1">
            <TimelineLegend bands={input.bands.length > 0} />
          </div>
        </section>
      )}

      <section className="report-section mb-6">
        <h2 className="mb-1 text-base font-semibold">Findings</h2>
        {data.findings.length === 0 ? (
          <p className="text-sm">No findings: every check passed.</p>
        ) : (
          <table>
            <thead>
              <tr>
                <th>Severity</th>
                <th>Time</th>
                <th>What happened</th>
              </tr>
            </thead>
            <tbody>
              {data.findings.map((f, index) => (
                <tr key={index}>
                  <td className="font-semibold">{SEVERITY_WORD[f.severity]}</td>
                  <td className="font-mono whitespace-nowrap">{f.t === undefined ? (f.line !== undefined ? `line ${f.line}` : '—') : formatSeconds(f.t)}</td>
                  <td>
                    <span className="font-medium">{f.title ?? ruleTitle(f.rule)}.</span> {f.message}
                    <span className="block text-xs text-slate-500">
                      <span className="font-mono">{f.rule}</span> · {f.ref}
                    </span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {data.findingsOmitted > 0 && <p className="mt-1 text-xs">{data.findingsOmitted} more findings were counted but not listed.</p>}
      </section>

      {timed.length > 0 && input.messages.length > 0 && (
        <section className="report-section mb-6">
          <h2 className="mb-1 text-base font-semibold">The messages around each finding</h2>
          {timed.map((f, index) => (
            <div key={index} className="report-keep mb-3">
              <p className="text-sm font-medium">
                {formatSeconds(f.t)} · {f.title ?? ruleTitle(f.rule)}
              </p>
              <table className="font-mono text-[11px]" aria-label={`Messages around ${f.rule} at ${formatSeconds(f.t)}`}>
                <tbody>
                  {messagesAround(input.messages, f.t!).map((m, row) => (
                    <tr key={row}>
                      <td className="whitespace-nowrap">{formatTimeUs(m.t)}</td>
                      <td>{m.from === 'source' ? 'source → sink' : m.from === 'sink' ? 'sink → source' : m.from}</td>
                      <td>{m.messageType}</td>
                      <td>#{m.messageId}</td>
                      <td>{m.crcOk ? (m.retry ? 'retry' : '') : 'bad CRC'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ))}
        </section>
      )}

      <footer className="mt-8 border-t border-slate-300 pt-3 text-xs text-slate-500">
        Parley analyses captures and simulates; it does not drive hardware. Real adapters deliver up to 48 V and 5 A: defer to the USB PD specification, certified test labs and local codes.
      </footer>
    </article>
  );
}
