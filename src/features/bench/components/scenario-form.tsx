import type { ReactNode } from 'react';
import { useFieldArray, useFormContext, useFormState } from 'react-hook-form';
import { Button } from '../../../components/button.tsx';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import { timersPd3 } from '../../../../shared/core/timers.ts';
import { defaultPolicy } from '../../../lib/offers-form/policy-fields.ts';
import type { BenchFormValues } from '../lib/form-model.ts';
import { ActionsEditor } from './actions-editor.tsx';
import { FaultsEditor } from './faults-editor.tsx';
import { numberField, optionalNumberField } from './form-fields.ts';
import { SourceOffersField } from './source-offers-field.tsx';
import { PolicyFields } from './policy-fields.tsx';

const sendSourceCapMs = { min: timersPd3.tTypeCSendSourceCap.minUs / 1_000, max: timersPd3.tTypeCSendSourceCap.maxUs / 1_000 };

const REVISIONS = [
  { value: '3.0', label: 'Revision 3.x' },
  { value: '2.0', label: 'Revision 2.0' },
];

function Section({ title, description, children }: { title: string; description?: string; children: ReactNode }) {
  return (
    <section className="flex flex-col gap-3 border-b border-slate-200 pb-5 last:border-b-0 last:pb-0 dark:border-slate-800" aria-label={title}>
      <div>
        <h3 className="text-xs font-semibold tracking-wide text-slate-900 uppercase dark:text-slate-100">{title}</h3>
        {description && <p className="mt-0.5 text-xs text-slate-500 dark:text-slate-400">{description}</p>}
      </div>
      {children}
    </section>
  );
}

function PolicyChanges() {
  const { control, register } = useFormContext<BenchFormValues>();
  const formState = useFormState({ control });
  const { fields, append, remove } = useFieldArray({ control, name: 'changes' });
  return (
    <div className="flex flex-col gap-2">
      <ol className="flex flex-col gap-2" aria-label="Policy changes">
        {fields.map((field, index) => (
          <li key={field.id} aria-label={`Policy change ${index + 1}`} className="grid grid-cols-[6rem_1fr_auto] items-start gap-2 rounded-md border border-slate-200 p-2 dark:border-slate-800">
            <Input label="At (ms)" type="number" min={0} mono error={formState.errors.changes?.[index]?.atMs?.message} {...register(`changes.${index}.atMs`, numberField)} />
            <PolicyFields name={`changes.${index}.policy`} label="Then" />
            <div className="pt-6">
              <Button variant="ghost" size="sm" aria-label={`Remove policy change ${index + 1}`} onClick={() => remove(index)}>
                ✕
              </Button>
            </div>
          </li>
        ))}
      </ol>
      <div>
        <Button variant="secondary" size="sm" onClick={() => append({ atMs: 2_000, policy: defaultPolicy('fixed') })}>
          + Change the policy later in the run
        </Button>
      </div>
    </div>
  );
}

const E_MARKERS = [
  { value: 'none', label: 'None (answers nothing on SOP′)' },
  { value: '3a-20v', label: '3 A, 20 V' },
  { value: '5a-20v', label: '5 A, 20 V' },
  { value: '5a-50v-epr', label: '5 A, 50 V, EPR capable' },
];

/** The scenario as a form: source, sink, cable, actions, faults, run length. */
export function ScenarioForm() {
  const { register, control } = useFormContext<BenchFormValues>();
  const { errors } = useFormState({ control });
  return (
    <div className="flex flex-col gap-5">
      <Section title="Source" description="What the source offers, in object-position order.">
        <SourceOffersField />
        <div className="grid grid-cols-2 gap-3">
          <Select label="Source specification revision" options={REVISIONS} {...register('sourceSpecRevision')} />
          <Input
            label="Offer interval (ms)"
            type="number"
            min={1}
            mono
            placeholder="Random"
            hint={`Empty: a random interval within tTypeCSendSourceCap (${sendSourceCapMs.min}–${sendSourceCapMs.max} ms).`}
            error={errors.capsIntervalMs?.message}
            {...register('capsIntervalMs', optionalNumberField)}
          />
        </div>
      </Section>

      <Section
        title="EPR offers"
        description="Offered from object position 8 in EPR mode (above 20 V, up to 48 V), once the sink enters EPR mode over an EPR cable. Real EPR adapters deliver up to 48 V at 5 A: follow the specification, a certified lab and local codes before touching hardware."
      >
        <SourceOffersField name="eprOffers" />
      </Section>

      <Section title="Sink" description="How the sink chooses its Request, and when it changes its mind.">
        <div className="grid grid-cols-2 gap-3">
          <Select label="Sink specification revision" options={REVISIONS} {...register('sinkSpecRevision')} />
          <Input
            label="EPR operational PDP (W)"
            type="number"
            min={1}
            max={240}
            mono
            placeholder="Not EPR capable"
            hint="Set: the sink enters EPR mode when the source and the cable allow it."
            error={errors.sinkEprPdpW?.message}
            {...register('sinkEprPdpW', optionalNumberField)}
          />
        </div>
        <PolicyFields name="policy" label="Sink policy" />
        <PolicyChanges />
      </Section>

      <Section title="Cable">
        <div className="grid grid-cols-2 gap-3">
          <Select
            label="Current rating"
            options={[
              { value: '3000', label: '3 A' },
              { value: '5000', label: '5 A (electronically marked)' },
            ]}
            {...register('cableCurrentMa', numberField)}
          />
          <Input label="Resistance, VBUS and return (mΩ)" type="number" min={0} mono error={errors.cableResistanceMohm?.message} {...register('cableResistanceMohm', numberField)} />
          <Select
            className="col-span-2"
            label="E-marker (Discover Identity on SOP′)"
            options={E_MARKERS}
            hint="The source offers more than 3 A only over a cable that says 5 A, and enters EPR only over a 50 V EPR cable."
            error={errors.eMarker?.message}
            {...register('eMarker')}
          />
        </div>
      </Section>

      <Section title="Actions" description="Messages a port starts at a time; the partner answers as the specification says.">
        <ActionsEditor />
      </Section>

      <Section title="Faults" description="Select a message by side, type and nth (1 = the first; empty = every one), or by time.">
        <FaultsEditor />
      </Section>

      <Section title="Run">
        <div className="grid grid-cols-2 gap-3">
          <Input label="Duration (ms)" type="number" min={1} mono error={errors.durationMs?.message} {...register('durationMs', numberField)} />
          <Input label="Seed" type="number" mono hint="The same seed gives the same trace." error={errors.seed?.message} {...register('seed', numberField)} />
        </div>
      </Section>
    </div>
  );
}
