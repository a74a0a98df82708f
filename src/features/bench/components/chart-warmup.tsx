import { useEffect, useState } from 'react';
import { VbusChart } from '../../../components/timeline/vbus-chart.tsx';

const SAMPLE = [
  { t: 0, mv: 5_000, ma: 100 },
  { t: 400_000, mv: 5_000, ma: 500 },
  { t: 450_000, mv: 9_000, ma: 2_000 },
  { t: 1_000_000, mv: 9_000, ma: 2_000 },
];
const noop = () => undefined;

/**
 * Draws the chart once, out of sight, while the page is idle after it opens: the first chart a
 * page draws costs about twice what later ones do (code compiled on first use, text measured and
 * cached), and that first time should not land in the middle of a run.
 */
export function ChartWarmup({ dark, onDone }: { dark: boolean; onDone?(): void }) {
  const [phase, setPhase] = useState<'waiting' | 'drawing' | 'done'>('waiting');
  useEffect(() => {
    if (phase === 'done') {
      onDone?.();
      return;
    }
    const timer = setTimeout(() => setPhase(phase === 'waiting' ? 'drawing' : 'done'), phase === 'waiting' ? 400 : 200);
    return () => clearTimeout(timer);
  }, [phase, onDone]);
  if (phase !== 'drawing') return null;
  return (
    <div aria-hidden="true" inert className="pointer-events-none invisible fixed top-0 -left-[10000px] w-[900px]">
      <VbusChart measurements={SAMPLE} sinkMeasurements={SAMPLE} window={{ startUs: 0, endUs: 1_000_000 }} endUs={1_000_000} pins={[{ tUs: 420_000, tone: 'info', label: 'warm-up' }]} onWindowChange={noop} dark={dark} />
    </div>
  );
}
