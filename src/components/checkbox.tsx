import type { InputHTMLAttributes, ReactNode, Ref } from 'react';
import { cn } from '../lib/cn.ts';

export type CheckboxProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'type' | 'className'> & {
  /** Read beside the box; clicking it toggles the box. */
  label: ReactNode;
  /** Classes of the label that holds box and text (placement in a grid, a fixed height). */
  className?: string;
  ref?: Ref<HTMLInputElement>;
};

/** A checkbox with its label beside it, the one the forms share. */
export function Checkbox({ label, className, ...rest }: CheckboxProps) {
  return (
    <label className={cn('inline-flex items-center gap-2 text-sm text-slate-700 dark:text-slate-300', className)}>
      <input type="checkbox" className="size-4 accent-amber-500" {...rest} />
      {label}
    </label>
  );
}
