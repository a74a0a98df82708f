// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
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
    <code className={cn('rounded bg-slate-100 px-1.5 py-0.5 font-mono text-[0.85em] break-words text-slate-800 dark:bg-slate-800 dark:text-amber-200', className)}>{formatHex(value, groupBytes)}</code>
  );
}

const dcSymbol = '\u2393';

/**
 * Text from a rating label, with the DC symbol (U+2393, "⎓") drawn as a small icon: the bundled
 * fonts have no glyph for it. The character itself stays in the text for copying and screen readers.
 */
export function RatingText({ value, className }: { value: string; className?: string }) {
  // Word by word, each kept on one line: a break may fall between "20V" and "⎓5A" otherwise (the sign is an inline picture).
  const words = value.split(/(\s+)/);
  return (
    <span className={className}>
      {words.map((word, wordIndex) =>
        word.includes(dcSymbol) ? (
          <span key={wordIndex} className="whitespace-nowrap">
            {word.split(dcSymbol).map((part, index) => (
              <span key={index}>
                {index > 0 && (
                  <>
                    <span className="sr-only">{dcSymbol}</span>
                    <svg aria-hidden="true" viewBox="0 0 10 8" className="mx-px inline-block h-[0.7em] w-[0.8em] align-baseline">
                      <path d="M0 2h10" stroke="currentColor" strokeWidth="1.2" />
                      <path d="M0 6h2.5M3.75 6h2.5M7.5 6h2.5" stroke="currentColor" strokeWidth="1.2" />
                    </svg>
                  </>
                )}
                {part}
              </span>
            ))}
          </span>
        ) : (
          word
        ),
      )}
    </span>
  );
}
