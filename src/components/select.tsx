import type { ReactNode, Ref, SelectHTMLAttributes } from 'react';
import { cn } from '../lib/cn.ts';
import { Field, controlBorder, controlClasses } from './field.tsx';

export type SelectOption = { value: string; label: string; disabled?: boolean };

export type SelectProps = Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id' | 'children'> & {
  label: ReactNode;
  options: readonly SelectOption[];
  error?: string;
  hint?: ReactNode;
  hideLabel?: boolean;
  ref?: Ref<HTMLSelectElement>;
};

export function Select({ label, options, error, hint, hideLabel, className, ...rest }: SelectProps) {
  return (
    <Field label={label} error={error} hint={hint} hideLabel={hideLabel} className={className}>
      {({ id, describedBy, invalid }) => (
        <select id={id} aria-invalid={invalid || undefined} aria-describedby={describedBy} className={cn(controlClasses, controlBorder(invalid), 'h-9 pr-8')} {...rest}>
          {options.map((option) => (
            <option key={option.value} value={option.value} disabled={option.disabled}>
              {option.label}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}
