// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { useId, useState } from 'react';
import { fieldCount, fieldValue, formatValue, type FieldLayout, type WordLayout } from '../../../../shared/pd/index.ts';
import { cn } from '../../../lib/cn.ts';

export type BitFieldProps = {
  /** The word's value (16 or 32 bits). */
  raw: number;
  layout: WordLayout;
  /** Shown before the layout's title, e.g. "Object 2". */
  caption: string;
};

const TONES = ['bg-amber-50 dark:bg-amber-400/10', 'bg-sky-50 dark:bg-sky-400/10', 'bg-emerald-50 dark:bg-emerald-400/10', 'bg-violet-50 dark:bg-violet-400/10'];

function bitsLabel(f: FieldLayout): string {
  return f.hi === f.lo ? `B${f.hi}` : `B${f.hi}…${f.lo}`;
}

/** The field's value as people read it: "5 V (100 × 50 mV)", "yes", "REQ", "10b". */
export function describeFieldValue(raw: number, f: FieldLayout): string {
  const count = fieldCount(raw, f);
  const width = f.hi - f.lo + 1;
  const binary = count.toString(2).padStart(width, '0') + 'b';
  if (f.type === 'reserved') return count === 0 ? 'zero (as required)' : `${binary} — set, but reserved`;
  if (f.type === 'const') return `${binary} — ${f.label}`;
  const value = fieldValue(raw, f);
  if (f.type === 'uint' && f.unit && (f.scale ?? 1) !== 1) return `${formatValue(f.name, value)} (${count} × ${f.scale} ${f.unit})`;
  if (f.type === 'uint' && f.unit) return `${count} ${f.unit}`;
  if (f.type === 'enum') return `${String(value)} (${binary})`;
  return formatValue(f.name, value);
}

/**
 * A 16- or 32-bit word drawn along its bits (most significant left), one box per field. Hovering
 * or focusing a field shows its name, bits, value with unit and the specification table.
 */
export function BitField({ raw, layout, caption }: BitFieldProps) {
  const [active, setActive] = useState<number | null>(null);
  const detailId = useId();
  const bits = layout.bits;
  const shown = active === null ? null : layout.fields[active];
  return (
    <figure className="space-y-2" aria-label={`${caption}: ${layout.title}`}>
      <figcaption className="flex flex-wrap items-baseline justify-between gap-2 text-xs">
        <span className="font-medium text-slate-800 dark:text-slate-100">
          {caption} · {layout.title}
        </span>
        <span className="font-mono text-slate-500 dark:text-slate-400">{layout.ref}</span>
      </figcaption>
      <div className="overflow-x-auto">
        <div className="grid min-w-[40rem] gap-px" style={{ gridTemplateColumns: `repeat(${bits}, minmax(0, 1fr))` }}>
          {Array.from({ length: bits }, (_, i) => (
            <span key={i} aria-hidden="true" className="text-center font-mono text-[9px] text-slate-400 tabular">
              {bits - 1 - i}
            </span>
          ))}
          {layout.fields.map((f, index) => {
            const width = f.hi - f.lo + 1;
            const count = fieldCount(raw, f);
            const digits = count.toString(2).padStart(width, '0');
            const reservedSet = f.type === 'reserved' && count !== 0;
            return (
              <button
                key={`${f.hi}-${f.lo}`}
                type="button"
                data-field={f.name}
                aria-describedby={active === index ? detailId : undefined}
                aria-label={`${f.label}, bits ${bitsLabel(f)}: ${describeFieldValue(raw, f)}`}
                onMouseEnter={() => setActive(index)}
                onFocus={() => setActive(index)}
                onMouseLeave={() => setActive((current) => (current === index ? null : current))}
                onBlur={() => setActive((current) => (current === index ? null : current))}
                style={{ gridColumn: `${bits - f.hi} / span ${width}` }}
                className={cn(
                  'flex min-w-0 flex-col items-stretch rounded-sm border px-0.5 py-1 text-left transition-colors',
                  'focus-visible:outline-2 focus-visible:outline-amber-500',
                  f.type === 'reserved'
                    ? 'border-dashed border-slate-300 bg-slate-50 dark:border-slate-700 dark:bg-slate-900'
                    : cn('border-slate-300 dark:border-slate-700', TONES[index % TONES.length]),
                  reservedSet && 'border-red-500 bg-red-50 dark:bg-red-500/10',
                  active === index && 'ring-2 ring-amber-500',
                )}
              >
                <span className="flex justify-around font-mono text-xs text-slate-900 tabular dark:text-slate-100" aria-hidden="true">
                  {digits.split('').map((d, i) => (
                    <span key={i}>{d}</span>
                  ))}
                </span>
                <span className="truncate text-center text-[10px] text-slate-600 dark:text-slate-400" aria-hidden="true">
                  {f.type === 'reserved' ? 'reserved' : f.label}
                </span>
              </button>
            );
          })}
        </div>
      </div>
      <p id={detailId} aria-live="polite" className="min-h-5 text-xs text-slate-700 dark:text-slate-300">
        {shown ? (
          <>
            <strong className="font-semibold">{shown.label}</strong> · <span className="font-mono">{bitsLabel(shown)}</span> · {describeFieldValue(raw, shown)} ·{' '}
            <span className="text-slate-500 dark:text-slate-400">{layout.ref}</span>
          </>
        ) : (
          <span className="text-slate-500 dark:text-slate-400">Point at or tab to a field to see its name, bits, value and source.</span>
        )}
      </p>
    </figure>
  );
}
