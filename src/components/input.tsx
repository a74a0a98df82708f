import type { InputHTMLAttributes, ReactNode, Ref } from 'react';
import { cn } from '../lib/cn.ts';
import { Field, controlBorder, controlClasses } from './field.tsx';

export type InputProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> & {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  hideLabel?: boolean;
  /** Monospace entry, for hex and numbers. */
  mono?: boolean;
  ref?: Ref<HTMLInputElement>;
};

export function Input({ label, error, hint, hideLabel, mono, className, ...rest }: InputProps) {
  return (
    <Field label={label} error={error} hint={hint} hideLabel={hideLabel} className={className}>
      {({ id, describedBy, invalid }) => (
        <input id={id} aria-invalid={invalid || undefined} aria-describedby={describedBy} className={cn(controlClasses, controlBorder(invalid), 'h-9', mono && 'font-mono tabular')} {...rest} />
      )}
    </Field>
  );
}
