/**
 * The analysis's timeline in the shape the timeline components take: contracts as spans with a
 * label, each contract's VBUS range as a band (the limits the analyser checked, which it keeps on
 * the timeline: shared/trace/vbus.ts), and the end of the trace.
 */
import type { ChartBand } from '../../../components/timeline/vbus-chart.tsx';
import type { TimelineSpan } from '../../../components/timeline/trace-timeline.tsx';
import type { LaneMessage } from '../../../components/timeline/message-lanes.tsx';
import type { Measurement } from '../../../components/timeline/trace-series.ts';
import type { BusEvent } from '../../../components/timeline/event-lane.tsx';
import type { Analysis, AnalysisSummary, TimelineWindow } from '../../../../shared/api/index.ts';
import { plural } from '../../../lib/plural.ts';
import { contractLabel } from './format.ts';

export type TimelineInput = {
  measurements: Measurement[];
  messages: LaneMessage[];
  events: BusEvent[];
  contracts: TimelineSpan[];
  bands: ChartBand[];
  endUs: number;
  /** A sentence when the server kept only part of a very long trace's timeline. */
  omitted: string | null;
};

/** A contract's VBUS band: the range the analyser checked its readings against (carried on the timeline). */
function bandOf(c: { startUs: number; endUs?: number; vbus?: { minMv: number; maxMv: number } }, endUs: number): ChartBand[] {
  return c.vbus ? [{ startUs: c.startUs, endUs: c.endUs ?? endUs, minMv: c.vbus.minMv, maxMv: c.vbus.maxMv }] : [];
}

/**
 * The chart's input from one window of the timeline (the server reads only that window) and the
 * analysis summary. Messages come with their place in the whole timeline; a GoodCRC's link is
 * turned into a place in this window's list (or dropped when its message is outside it).
 */
export function timelineInput(summary: AnalysisSummary, view: TimelineWindow): TimelineInput {
  const { endUs, timeline } = summary;
  // A capture that renegotiates all day repeats a few hundred contracts thousands of times: each label is written once.
  const labels = new Map<string, string>();
  const labelOf = (contract: TimelineWindow['contracts'][number]['contract']) => {
    const key = `${contract.kind} ${contract.voltageMv} ${contract.currentMa}`;
    const known = labels.get(key);
    if (known !== undefined) return known;
    const label = contractLabel(contract);
    labels.set(key, label);
    return label;
  };
  const contracts = view.contracts.map((c) => ({ startUs: c.startUs, ...(c.endUs === undefined ? {} : { endUs: c.endUs }), label: labelOf(c.contract) }));
  const bands = view.contracts.flatMap((c) => bandOf(c, endUs));
  const placeOf = new Map<number, number>();
  for (const [place, m] of view.messages.entries()) placeOf.set(m.index, place);
  const messages: LaneMessage[] = view.messages.map(({ index: _index, goodCrcFor, ...m }) => {
    const acknowledged = goodCrcFor === undefined ? undefined : placeOf.get(goodCrcFor);
    return acknowledged === undefined ? m : { ...m, goodCrcFor: acknowledged };
  });
  const parts = [
    timeline.omitted.messages > 0 ? `the first ${plural(timeline.messages, 'message')} (${timeline.omitted.messages} later ones are left out)` : '',
    view.messagesOmitted > 0 ? `the first ${plural(view.messages.length, 'message')} of this window (zoom in to see the other ${view.messagesOmitted})` : '',
    timeline.measurementStride > 1 || view.measurementLevel > 0 ? 'a thinned series of VBUS readings that keeps every low and high' : '',
  ].filter(Boolean);
  return {
    // The readings either side of the window carry the held value to its edges.
    measurements: [...(view.readingBefore ? [view.readingBefore] : []), ...view.measurements, ...(view.readingAfter ? [view.readingAfter] : [])],
    messages,
    events: view.events,
    contracts,
    bands,
    endUs,
    omitted: parts.length > 0 ? `The timeline draws ${parts.join(' and ')}; the findings cover the whole file.` : null,
  };
}
/** The same from a whole analysis (the printable report, which reads it all). */
export function timelineInputOfAnalysis(analysis: Analysis): TimelineInput {
  const { timeline } = analysis;
  const lastMessage = timeline.messages[timeline.messages.length - 1];
  const lastMeasurement = timeline.measurements[timeline.measurements.length - 1];
  const lastEvent = timeline.events[timeline.events.length - 1];
  let lastFinding = 0;
  for (const f of analysis.findings) lastFinding = Math.max(lastFinding, f.t ?? 0);
  const endUs = Math.max(1, lastMessage ? lastMessage.t + lastMessage.durationUs : 0, lastMeasurement?.t ?? 0, lastEvent?.t ?? 0, lastFinding);
  const contracts = timeline.contracts.map((c) => ({ startUs: c.startUs, ...(c.endUs === undefined ? {} : { endUs: c.endUs }), label: contractLabel(c.contract) }));
  const bands = timeline.contracts.flatMap((c) => bandOf(c, endUs));
  const { omitted, measurementStride } = timeline;
  const parts = [
    omitted.messages > 0 ? `the first ${timeline.messages.length} messages (${omitted.messages} later ones are left out)` : '',
    measurementStride > 1 ? `one VBUS reading in every ${measurementStride}` : '',
  ].filter(Boolean);
  return {
    measurements: timeline.measurements,
    messages: timeline.messages,
    events: timeline.events,
    contracts,
    bands,
    endUs,
    omitted: parts.length > 0 ? `A long trace: the timeline draws ${parts.join(' and ')}; the findings cover the whole file.` : null,
  };
}
