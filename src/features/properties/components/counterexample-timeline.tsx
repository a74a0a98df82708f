// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { StateLanes } from '../../../components/timeline/state-lanes.tsx';
import { formatTimeUs, positionIn, type TimeWindow } from '../../../components/timeline/time-window.ts';
import type { CounterexampleRun } from '../../../../workers/property.worker.ts';

const AXIS_WIDTH_PX = 44;
const MARGIN_PX = 8;
const INSET_PX = AXIS_WIDTH_PX + MARGIN_PX;

/** From the start to a little after the last message: the negotiation, not the quiet tail. */
export function timelineWindow(run: CounterexampleRun): TimeWindow {
  const lastUs = Math.max(0, ...run.messages.map((m) => m.t), ...run.events.map((e) => e.t));
  const endUs = lastUs === 0 ? run.endUs : Math.min(run.endUs, Math.ceil((lastUs * 1.25 + 20_000) / 10_000) * 10_000);
  return { startUs: 0, endUs: Math.max(endUs, 1_000) };
}

type Point = { tMs: number; vbusV: number; ibusA: number };

function pointsOf(samples: readonly number[], window: TimeWindow): Point[] {
  const points: Point[] = [];
  for (let i = 0; i + 3 < samples.length; i += 4) {
    const tUs = samples[i]!;
    if (tUs > window.endUs) break;
    points.push({ tMs: tUs / 1_000, vbusV: samples[i + 1]! / 1_000, ibusA: samples[i + 2]! / 1_000 });
  }
  return points;
}

/** One lane per side: a tick at each message, named in its tooltip and, where there is room, below. */
function MessageLanes({ run, window }: { run: CounterexampleRun; window: TimeWindow }) {
  return (
    <div className="flex flex-col gap-1" role="group" aria-label="Messages by sender">
      {(['source', 'sink'] as const).map((side) => {
        const own = run.messages.filter((m) => m.from === side);
        return (
          <div key={side} className="flex items-center" style={{ paddingRight: INSET_PX }}>
            <span className="shrink-0 pr-2 text-right font-mono text-[10px] text-slate-500 uppercase dark:text-slate-400" style={{ width: INSET_PX }}>
              {side === 'source' ? 'SRC' : 'SNK'}
            </span>
            <div className="relative h-7 flex-1 rounded-sm bg-slate-50 dark:bg-slate-950" data-testid={`message-lane-${side}`}>
              {own.map((m, i) => {
                const left = `${(positionIn(window, m.t) * 100).toFixed(3)}%`;
                const goodCrc = m.messageType === 'GoodCRC';
                return (
                  <span
                    key={`${m.t}-${i}`}
                    title={`${formatTimeUs(m.t)} ${m.messageType} ${m.hex}`}
                    className={goodCrc ? 'absolute top-1 h-2 w-px bg-slate-400 dark:bg-slate-500' : 'absolute top-0.5 h-6 w-0.5 rounded-full bg-amber-500'}
                    style={{ left }}
                  />
                );
              })}
            </div>
          </div>
        );
      })}
    </div>
  );
}

/** The counterexample as a scenario: VBUS and IBUS, the policy-engine states and the messages on one time axis. */
export default function CounterexampleTimeline({ run }: { run: CounterexampleRun }) {
  const window = timelineWindow(run);
  const points = pointsOf(run.samples, window);
  const endMs = window.endUs / 1_000;
  return (
    <figure aria-label="Counterexample timeline" className="space-y-2">
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={points} margin={{ top: 8, right: MARGIN_PX, bottom: 4, left: MARGIN_PX }}>
            <CartesianGrid strokeDasharray="3 3" stroke="currentColor" strokeOpacity={0.12} />
            <XAxis type="number" dataKey="tMs" domain={[0, endMs]} unit=" ms" tick={{ fontSize: 11 }} allowDataOverflow />
            <YAxis yAxisId="v" width={AXIS_WIDTH_PX} unit=" V" tick={{ fontSize: 11 }} domain={[0, 'auto']} />
            <YAxis yAxisId="a" width={AXIS_WIDTH_PX} orientation="right" unit=" A" tick={{ fontSize: 11 }} domain={[0, 'auto']} />
            <Tooltip formatter={(value, name) => [String(value), String(name)]} labelFormatter={(label) => `${String(label)} ms`} />
            <Legend verticalAlign="top" height={22} wrapperStyle={{ fontSize: 11 }} />
            <Line yAxisId="v" type="stepAfter" dataKey="vbusV" name="VBUS (V)" stroke="#d97706" dot={false} strokeWidth={2} isAnimationActive={false} />
            <Line yAxisId="a" type="stepAfter" dataKey="ibusA" name="IBUS (A)" stroke="#0f766e" dot={false} strokeWidth={1.5} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <StateLanes entries={run.lanes} window={window} endUs={run.endUs} insetLeftPx={INSET_PX} insetRightPx={INSET_PX} />
      <MessageLanes run={run} window={window} />
      <figcaption className="pl-13 text-[11px] text-slate-500 dark:text-slate-400">
        {formatTimeUs(window.startUs)} to {formatTimeUs(window.endUs)} of a {formatTimeUs(run.endUs)} run; amber ticks are messages, grey ticks GoodCRC.
      </figcaption>
    </figure>
  );
}
