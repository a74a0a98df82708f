import type { ReactNode } from 'react';
import { cn } from '../lib/cn.ts';

/** Monospace text with tabular figures: numbers, ids, units. */
export function Mono({ children, className, title }: { children: ReactNode; className?: string; title?: string }) {
  return (
    <span title={title} className={cn('font-mono text-[0.92em] tabular', className)}>
      {children}
    </span>
  );
}

/** Hex groups every two digits (one byte) so long values stay readable; `0x` prefix optional. */
export function formatHex(hex: string, groupBytes = 1): string {
  const clean = hex.replace(/^0x/i, '').replace(/[\s:]/g, '').toLowerCase();
  const size = groupBytes * 2;
  const groups: string[] = [];
  for (let index = 0; index < clean.length; index += size) groups.push(clean.slice(index, index + size));
  return groups.join(' ');
}

export type HexProps = {
  /** Hex digits, with or without 0x, spaces or colons. */
  value: string;
  groupBytes?: number;
  className?: string;
};

/** Bytes as hex, grouped, selectable, never wrapped mid-byte. */
export function Hex({ value, groupBytes = 1, className }: HexProps) {
  return (
    <code
      className={cn(
        'rounded bg-slate-100 px-1.5 py-0.5 font-mono text-[0.85em] break-words text-slate-800 dark:bg-slate-800 dark:text-amber-200',
        className,
      )}
    >
      {formatHex(value, groupBytes)}
    </code>
  );
}
