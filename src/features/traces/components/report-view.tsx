// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { useMemo } from 'react';
import type { Finding } from '../../../../shared/core/finding.ts';
import { ruleTitle } from '../../../../shared/rules/catalog.ts';
import type { Analysis, MessagesAroundFindings } from '../../../../shared/api/index.ts';
import { REPORT_FINDINGS_WITH_MESSAGES, REPORT_MESSAGES_AROUND } from '../../../../shared/trace/views.ts';
import { ParleyMark } from '../../../components/parley-mark.tsx';
import { chartEventsOf } from '../../../components/timeline/event-lane.tsx';
import { chartPinsOf } from '../../../components/timeline/finding-pins.tsx';
import { formatTimeUs } from '../../../components/timeline/time-window.ts';
import { PLOT_INSET_LEFT_PX, VbusChart } from '../../../components/timeline/vbus-chart.tsx';
import { TimelineLegend } from '../../../components/timeline/timeline-legend.tsx';
import type { LaneMessage } from '../../../components/timeline/message-lanes.tsx';
import type { ChartEvent } from '../../../components/timeline/vbus-chart.tsx';
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
  /** The messages around the first timed findings, read by the server from every message of the trace (the timeline keeps only the first 20,000). */
  aroundFindings: MessagesAroundFindings['items'];
  notes?: string;
  /** A line at the top (e.g. "Shared read-only until 2026-12-18"). */
  banner?: string;
};

/** A row of the list around a finding: a message, or an event on the bus (a Hard Reset is no message). */
type AroundMessage = Pick<LaneMessage, 't' | 'from' | 'messageType' | 'messageId' | 'crcOk' | 'retry'>;
type AroundRow = { t: number; message: AroundMessage } | { t: number; event: ChartEvent };

/** The messages (GoodCRC left out) and bus events nearest a finding: `REPORT_MESSAGES_AROUND` before its time and as many from it on. */
function rowsAround(messages: readonly AroundMessage[], events: readonly ChartEvent[], tUs: number): AroundRow[] {
  const rows: AroundRow[] = [...messages.filter((m) => m.messageType !== 'GoodCRC').map((message) => ({ t: message.t, message })), ...events.map((event) => ({ t: event.tUs, event }))].sort(
    (a, b) => a.t - b.t,
  );
  let index = rows.findIndex((row) => row.t >= tUs);
  if (index === -1) index = rows.length;
  return rows.slice(Math.max(0, index - REPORT_MESSAGES_AROUND), index + REPORT_MESSAGES_AROUND);
}

const directionOf = (from: string | undefined) => (from === 'source' ? 'source → sink' : from === 'sink' ? 'sink → source' : (from ?? ''));

/** Contract kinds in the customer's words (PD R3.2 §6.4.1 names the supplies). */
const CONTRACT_KIND_WORDS: Record<Analysis['contracts'][number]['kind'], string> = {
  fixed: 'Fixed supply',
  variable: 'Variable supply',
  battery: 'Battery supply',
  pps: 'Programmable (PPS)',
  avs: 'Adjustable (AVS)',
};

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
  const timed = data.findings.filter((f) => f.t !== undefined).slice(0, REPORT_FINDINGS_WITH_MESSAGES);

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
                  <td>{CONTRACT_KIND_WORDS[c.kind]}</td>
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
          <VbusChart measurements={input.measurements} window={whole} endUs={input.endUs} pins={pins} events={events} bands={input.bands} onWindowChange={nothing} overview={false} />
          <div style={{ paddingLeft: PLOT_INSET_LEFT_PX }} className="mt-1">
            <TimelineLegend bands={input.bands.length > 0} messages={false} faults={false} />
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

      {timed.length > 0 && data.aroundFindings.some((around) => around.messages.length > 0) && (
        <section className="report-section mb-6">
          <h2 className="mb-1 text-base font-semibold">The messages around each finding</h2>
          {timed.map((f, index) => (
            <div key={index} className="report-keep mb-3">
              <p className="text-sm font-medium">
                {formatSeconds(f.t)} · {f.title ?? ruleTitle(f.rule)}
              </p>
              <table className="table-fixed font-mono text-[11px]" aria-label={`Messages around ${f.rule} at ${formatSeconds(f.t)}`}>
                <colgroup>
                  <col className="w-[7rem]" />
                  <col className="w-[8rem]" />
                  <col />
                  <col className="w-[4rem]" />
                  <col className="w-[5rem]" />
                </colgroup>
                <tbody>
                  {rowsAround(data.aroundFindings.find((around) => around.t === f.t)?.messages ?? [], events, f.t!).map((row, at) =>
                    'message' in row ? (
                      <tr key={at}>
                        <td className="whitespace-nowrap">{formatTimeUs(row.t)}</td>
                        <td>{directionOf(row.message.from)}</td>
                        <td>{row.message.messageType}</td>
                        <td>#{row.message.messageId}</td>
                        <td>{row.message.crcOk ? (row.message.retry ? 'retry' : '') : 'bad CRC'}</td>
                      </tr>
                    ) : (
                      <tr key={at} className="font-semibold">
                        <td className="whitespace-nowrap">{formatTimeUs(row.t)}</td>
                        <td colSpan={4}>{row.event.label}</td>
                      </tr>
                    ),
                  )}
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
