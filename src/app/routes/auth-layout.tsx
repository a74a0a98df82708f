import { Outlet } from 'react-router';
import { ThemeSwitch } from '../../components/theme-switch.tsx';
import { ParleyMark } from '../../components/parley-mark.tsx';

/** A small exchange drawn in the side panel: offer, request, accept, ready. */
function ExchangeSketch() {
  const steps = [
    { y: 28, from: 'source', label: 'Source_Capabilities' },
    { y: 64, from: 'sink', label: 'Request' },
    { y: 100, from: 'source', label: 'Accept' },
    { y: 136, from: 'source', label: 'PS_RDY' },
  ] as const;
  return (
    <svg viewBox="0 0 280 170" className="w-full max-w-sm" role="img" aria-label="A power negotiation: offer, request, accept, power ready">
      <text x="24" y="12" className="fill-slate-400 font-mono text-[9px]">
        SOURCE
      </text>
      <text x="226" y="12" className="fill-slate-400 font-mono text-[9px]">
        SINK
      </text>
      <line x1="40" y1="18" x2="40" y2="160" className="stroke-slate-600" strokeDasharray="2 3" />
      <line x1="240" y1="18" x2="240" y2="160" className="stroke-slate-600" strokeDasharray="2 3" />
      {steps.map((step) => {
        const [x1, x2] = step.from === 'source' ? [40, 240] : [240, 40];
        const head = step.from === 'source' ? `${x2 - 6},${step.y - 4} ${x2},${step.y} ${x2 - 6},${step.y + 4}` : `${x2 + 6},${step.y - 4} ${x2},${step.y} ${x2 + 6},${step.y + 4}`;
        return (
          <g key={step.label}>
            <line x1={x1} y1={step.y} x2={x2} y2={step.y} className="stroke-amber-400" strokeWidth="1.5" />
            <polygon points={head} className="fill-amber-400" />
            <text x="140" y={step.y - 6} textAnchor="middle" className="fill-slate-200 font-mono text-[10px]">
              {step.label}
            </text>
          </g>
        );
      })}
    </svg>
  );
}

/** Sign-in, password and invitation pages: a brand panel and a form. */
export function AuthLayout() {
  return (
    <div className="grid min-h-screen lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
      <aside className="relative hidden flex-col justify-between overflow-hidden bg-slate-900 p-10 text-slate-100 lg:flex">
        <div
          aria-hidden="true"
          className="pointer-events-none absolute inset-0 opacity-[0.07] [background-image:linear-gradient(to_right,#fff_1px,transparent_1px),linear-gradient(to_bottom,#fff_1px,transparent_1px)] [background-size:24px_24px]"
        />
        <div className="relative flex items-center gap-3">
          <ParleyMark className="size-9" />
          <span className="text-lg font-semibold tracking-tight">Parley</span>
        </div>
        <div className="relative space-y-6">
          <ExchangeSketch />
          <p className="max-w-sm text-xl leading-snug font-medium text-white">Replay, check and explain USB Power Delivery negotiations.</p>
          <p className="max-w-sm text-sm text-slate-400">Decode field logs, keep a library of test vectors, inject faults into simulated exchanges.</p>
        </div>
        <p className="relative font-mono text-[11px] text-slate-500">USB PD · Type-C · simulated, never live</p>
      </aside>
      <main className="relative flex flex-col items-center justify-center px-6 py-12">
        <div className="absolute top-4 right-4">
          <ThemeSwitch />
        </div>
        <div className="mb-8 flex items-center gap-2.5 lg:hidden">
          <ParleyMark className="size-8" />
          <span className="text-lg font-semibold tracking-tight">Parley</span>
        </div>
        <div className="w-full max-w-sm">
          <Outlet />
        </div>
      </main>
    </div>
  );
}
