import type { ReactNode, Ref, TextareaHTMLAttributes } from 'react';
import { cn } from '../lib/cn.ts';
import { Field, controlBorder, controlClasses } from './field.tsx';

export type TextareaProps = Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id'> & {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  hideLabel?: boolean;
  mono?: boolean;
  ref?: Ref<HTMLTextAreaElement>;
};

export function Textarea({ label, error, hint, hideLabel, mono, className, rows = 4, ...rest }: TextareaProps) {
  return (
    <Field label={label} error={error} hint={hint} hideLabel={hideLabel} className={className}>
      {({ id, describedBy, invalid }) => (
        <textarea
          id={id}
          rows={rows}
          aria-invalid={invalid || undefined}
          aria-describedby={describedBy}
          className={cn(controlClasses, controlBorder(invalid), 'py-2', mono && 'font-mono text-xs tabular')}
          {...rest}
        />
      )}
    </Field>
  );
}
