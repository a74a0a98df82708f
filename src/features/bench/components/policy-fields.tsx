import { get, useFormContext, useFormState, useWatch } from 'react-hook-form';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import { defaultPolicy, type BenchFormValues, type PolicyKind } from '../lib/form-model.ts';
import { numberField } from './form-fields.ts';

const KINDS: { value: PolicyKind; label: string }[] = [
  { value: 'max-power', label: 'Most power (max-power)' },
  { value: 'fixed', label: 'A fixed voltage (fixed)' },
  { value: 'pps', label: 'A programmable voltage (pps)' },
  { value: 'range', label: 'A voltage range with enough power (range)' },
];

type PolicyPath = 'policy' | `changes.${number}.policy`;

const NUMBERS: Record<Exclude<PolicyKind, 'max-power'>, { key: string; label: string; step: number }[]> = {
  fixed: [
    { key: 'voltageMv', label: 'Voltage (mV)', step: 50 },
    { key: 'currentMa', label: 'Current (mA)', step: 10 },
  ],
  pps: [
    { key: 'voltageMv', label: 'Voltage (mV)', step: 20 },
    { key: 'currentMa', label: 'Current (mA)', step: 50 },
  ],
  range: [
    { key: 'minVoltageMv', label: 'Min voltage (mV)', step: 50 },
    { key: 'maxVoltageMv', label: 'Max voltage (mV)', step: 50 },
    { key: 'powerMw', label: 'Power (mW)', step: 250 },
  ],
};

/** One sink policy (vector.md's four): the kind, then that kind's numbers. */
export function PolicyFields({ name, label }: { name: PolicyPath; label: string }) {
  const { register, setValue, control } = useFormContext<BenchFormValues>();
  const formState = useFormState({ control });
  const kind = (useWatch({ control, name: `${name}.kind` as 'policy.kind' }) ?? 'max-power') as PolicyKind;
  const errorAt = (key: string): string | undefined => (get(formState.errors, `${name}.${key}`) as { message?: string } | undefined)?.message;

  return (
    <div className="grid grid-cols-1 gap-2 sm:grid-cols-[minmax(14rem,1.3fr)_2fr]">
      <Select
        label={label}
        value={kind}
        options={KINDS}
        onChange={(event) => setValue(name as 'policy', defaultPolicy(event.target.value as PolicyKind), { shouldDirty: true, shouldValidate: formState.isSubmitted })}
      />
      {kind === 'max-power' ? (
        <p className="self-end pb-2 text-xs text-slate-500 dark:text-slate-400">
          The fixed, variable or battery offer with the most power within the cable’s rating; on a tie, the lower voltage.
        </p>
      ) : (
        <div className="grid grid-cols-3 gap-2">
          {NUMBERS[kind].map(({ key, label: fieldLabel, step }) => (
            <Input
              key={`${kind}-${key}`}
              label={fieldLabel}
              type="number"
              mono
              min={0}
              step={step}
              error={errorAt(key)}
              {...register(`${name}.${key}` as 'policy.kind', numberField)}
            />
          ))}
        </div>
      )}
    </div>
  );
}
