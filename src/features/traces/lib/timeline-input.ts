/**
 * The analysis's timeline in the shape the timeline components take: contracts as spans with a
 * label, the VBUS tolerance of fixed and programmable contracts as bands (the limits the
 * analyser checks, shared/trace/vbus.ts: vSafe5V 4.75–5.5 V, otherwise ±5 %; USB PD R3.2 V1.1
 * §7.1, from memory), and the end of the trace.
 */
import type { ChartBand } from '../../../components/timeline/vbus-chart.tsx';
import type { TimelineSpan } from '../../../components/timeline/trace-timeline.tsx';
import type { LaneMessage } from '../../../components/timeline/message-lanes.tsx';
import type { Measurement } from '../../../components/timeline/trace-series.ts';
import type { AnalysisSummary, TimelineWindow } from '../../../../shared/api/index.ts';
import { contractLabel } from './format.ts';

export type TimelineInput = {
  measurements: Measurement[];
  messages: LaneMessage[];
  contracts: TimelineSpan[];
  bands: ChartBand[];
  endUs: number;
  /** A sentence when the server kept only part of a very long trace's timeline. */
  omitted: string | null;
};

const TOLERANCE = 0.05;

function limitsMv(kind: string, voltageMv: number): [number, number] | null {
  if (kind === 'fixed' && voltageMv === 5_000) return [4_750, 5_500];
  if (kind === 'fixed' || kind === 'pps' || kind === 'avs') return [Math.round(voltageMv * (1 - TOLERANCE)), Math.round(voltageMv * (1 + TOLERANCE))];
  return null;
}

/** The chart's input from a window of the timeline (the server reads only that window) and the analysis summary. */
export function timelineInput(summary: AnalysisSummary, window: TimelineWindow): TimelineInput {
  const { endUs, timeline } = summary;
  const contracts = window.contracts.map((c) => ({ startUs: c.startUs, ...(c.endUs === undefined ? {} : { endUs: c.endUs }), label: contractLabel(c.contract) }));
  const bands = window.contracts.flatMap((c) => {
    const limits = limitsMv(c.contract.kind, c.contract.voltageMv);
    return limits ? [{ startUs: c.startUs, endUs: c.endUs ?? endUs, minMv: limits[0], maxMv: limits[1] }] : [];
  });
  const { omitted, measurementStride } = timeline;
  const parts = [
    omitted.messages > 0 ? `the first ${timeline.messages} messages (${omitted.messages} later ones are left out)` : '',
    window.messagesOmitted > 0 ? `the first ${window.messages.length} messages of this window (${window.messagesOmitted} more)` : '',
    measurementStride > 1 || window.measurementLevel > 0 ? 'a thinned series of VBUS readings that keeps every low and high' : '',
  ].filter(Boolean);
  return {
    measurements: window.measurements,
    messages: window.messages,
    contracts,
    bands,
    endUs,
    omitted: parts.length > 0 ? `A long trace: the timeline draws ${parts.join(' and ')}; the findings cover the whole file.` : null,
  };
}
