import { CartesianGrid, ComposedChart, Legend, ReferenceArea, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from 'recharts';
import type { SourcePdo } from '../../../../shared/pd/types.ts';

type Point = { voltageV: number; currentA: number; powerW: number; name: string };
type Band = { minV: number; maxV: number; currentA: number; name: string };

const round = (value: number) => Math.round(value * 100) / 100;

/** Fixed offers as points (current and power against voltage), programmable ranges as bands. */
function envelope(pdos: readonly SourcePdo[]): { points: Point[]; bands: Band[] } {
  const points: Point[] = [];
  const bands: Band[] = [];
  pdos.forEach((pdo, i) => {
    if (Number.parseInt(pdo.raw, 16) === 0) return;
    const name = `#${i + 1}`;
    if (pdo.kind === 'fixed') points.push({ voltageV: pdo.voltageMv / 1_000, currentA: pdo.maxCurrentMa / 1_000, powerW: round((pdo.voltageMv * pdo.maxCurrentMa) / 1e6), name: `${name} fixed` });
    else if (pdo.kind === 'pps' || pdo.kind === 'variable')
      bands.push({ minV: pdo.minVoltageMv / 1_000, maxV: pdo.maxVoltageMv / 1_000, currentA: pdo.maxCurrentMa / 1_000, name: `${name} ${pdo.kind === 'pps' ? 'PPS' : 'variable'}` });
    else if (pdo.kind === 'battery') bands.push({ minV: pdo.minVoltageMv / 1_000, maxV: pdo.maxVoltageMv / 1_000, currentA: round(pdo.maxPowerMw / pdo.maxVoltageMv), name: `${name} battery` });
    else if (pdo.kind === 'epr-avs')
      bands.push({ minV: pdo.minVoltageMv / 1_000, maxV: pdo.maxVoltageMv / 1_000, currentA: Math.min(5, round(pdo.pdpW / (pdo.minVoltageMv / 1_000 || 1))), name: `${name} EPR AVS` });
    else if (pdo.kind === 'spr-avs') bands.push({ minV: 9, maxV: 20, currentA: Math.max(pdo.maxCurrent15vMa, pdo.maxCurrent20vMa) / 1_000, name: `${name} SPR AVS` });
  });
  return { points, bands };
}

export type EnvelopeChartProps = { pdos: readonly SourcePdo[]; cableMa: number | undefined };

export default function EnvelopeChart({ pdos, cableMa }: EnvelopeChartProps) {
  const { points, bands } = envelope(pdos);
  const maxV = Math.max(21, ...points.map((p) => p.voltageV), ...bands.map((b) => b.maxV)) + 1;
  const maxA = Math.max(5.5, ...points.map((p) => p.currentA), ...bands.map((b) => b.currentA));
  return (
    <figure aria-label="Power envelope" className="h-80 w-full">
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart margin={{ top: 12, right: 24, bottom: 24, left: 8 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="currentColor" strokeOpacity={0.12} />
          <XAxis
            type="number"
            dataKey="voltageV"
            domain={[0, Math.ceil(maxV)]}
            unit=" V"
            name="Voltage"
            tick={{ fontSize: 11 }}
            label={{ value: 'Voltage (V)', position: 'insideBottom', offset: -12, fontSize: 11 }}
          />
          <YAxis yAxisId="a" type="number" dataKey="currentA" domain={[0, Math.ceil(maxA)]} unit=" A" name="Current" tick={{ fontSize: 11 }} />
          <YAxis yAxisId="w" type="number" dataKey="powerW" orientation="right" unit=" W" name="Power" tick={{ fontSize: 11 }} />
          {bands.map((b) => (
            <ReferenceArea
              key={b.name}
              yAxisId="a"
              x1={b.minV}
              x2={b.maxV}
              y1={0}
              y2={b.currentA}
              fill="#0ea5e9"
              fillOpacity={0.12}
              stroke="#0ea5e9"
              strokeOpacity={0.5}
              label={{ value: b.name, position: 'insideTopLeft', fontSize: 10 }}
            />
          ))}
          <ReferenceLine
            yAxisId="a"
            y={(cableMa ?? 3_000) / 1_000}
            stroke="#f59e0b"
            strokeDasharray="6 3"
            label={{ value: `cable ${(cableMa ?? 3_000) / 1_000} A`, position: 'insideTopRight', fontSize: 10 }}
          />
          <Tooltip formatter={(value, name) => [String(value), String(name)]} />
          <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 11 }} />
          <Scatter yAxisId="a" name="Current (A)" data={points} dataKey="currentA" fill="#0f766e" />
          <Scatter yAxisId="w" name="Power (W)" data={points} dataKey="powerW" fill="#d97706" shape="diamond" />
        </ComposedChart>
      </ResponsiveContainer>
      <figcaption className="sr-only">
        {points.map((p) => `${p.name}: ${p.voltageV} V, ${p.currentA} A, ${p.powerW} W`).join('; ')}
        {bands.map((b) => `; ${b.name}: ${b.minV}–${b.maxV} V up to ${b.currentA} A`).join('')}
      </figcaption>
    </figure>
  );
}
