import { get, useFormContext, useFormState, useWatch } from 'react-hook-form';
import { Input } from '../../../components/input.tsx';
import { Mono } from '../../../components/mono.tsx';
import { Select } from '../../../components/select.tsx';
import { defaultPolicy, policyFields, policyKindHelp, policyKindOptions, type PolicyKind } from '../../../lib/offers-form/policy-fields.ts';
import type { BenchFormValues } from '../lib/form-model.ts';
import { numberField } from './form-fields.ts';

type PolicyPath = 'policy' | `changes.${number}.policy`;

/** One sink policy (vector.md's four): the kind with a line of help, then that kind's numbers. */
export function PolicyFields({ name, label }: { name: PolicyPath; label: string }) {
  const { register, setValue, control } = useFormContext<BenchFormValues>();
  const formState = useFormState({ control });
  const kind = (useWatch({ control, name: `${name}.kind` as 'policy.kind' }) ?? 'max-power') as PolicyKind;
  const errorAt = (key: string): string | undefined => (get(formState.errors, `${name}.${key}`) as { message?: string } | undefined)?.message;
  const fields = policyFields[kind];

  return (
    <div className="flex flex-col gap-2">
      <Select
        label={label}
        value={kind}
        options={policyKindOptions}
        hint={
          <>
            <Mono>{kind}</Mono> · {policyKindHelp[kind]}
          </>
        }
        onChange={(event) => setValue(name as 'policy', defaultPolicy(event.target.value as PolicyKind), { shouldDirty: true, shouldValidate: formState.isSubmitted })}
      />
      {fields.length > 0 && (
        <div className="grid grid-cols-3 gap-2">
          {fields.map(({ name: key, label: fieldLabel, step }) => (
            <Input key={`${kind}-${key}`} label={fieldLabel} type="number" mono min={0} step={step} error={errorAt(key)} {...register(`${name}.${key}` as 'policy.kind', numberField)} />
          ))}
        </div>
      )}
    </div>
  );
}
