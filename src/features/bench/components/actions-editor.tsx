import { get, useFieldArray, useFormContext, useFormState } from 'react-hook-form';
import { Button } from '../../../components/button.tsx';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import { actionNames, type ActionName } from '../../../../shared/sim/scenario.ts';
import type { BenchFormValues } from '../lib/form-model.ts';
import { numberField } from './form-fields.ts';

/** What each action sends first (USB PD message names), for the drop-down. */
const ACTION_LABELS: Record<ActionName, string> = {
  get_source_cap: 'Get_Source_Cap — ask for the offers',
  get_sink_cap: 'Get_Sink_Cap — ask for the sink’s capabilities',
  get_source_cap_extended: 'Get_Source_Cap_Extended',
  get_status: 'Get_Status',
  get_pps_status: 'Get_PPS_Status',
  pr_swap: 'PR_Swap — swap power roles',
  dr_swap: 'DR_Swap — swap data roles',
  vconn_swap: 'VCONN_Swap',
  soft_reset: 'Soft_Reset',
  hard_reset: 'Hard Reset',
  epr_exit: 'EPR_Mode (Exit) — leave EPR mode',
};
const ACTION_OPTIONS = actionNames.map((value) => ({ value, label: ACTION_LABELS[value] }));

/** Messages a port starts at a time; the partner answers as the specification says (vector.md `actions`). */
export function ActionsEditor() {
  const { control, register } = useFormContext<BenchFormValues>();
  const formState = useFormState({ control });
  const { fields, append, remove } = useFieldArray({ control, name: 'actions' });
  const errorAt = (path: string): string | undefined => (get(formState.errors, path) as { message?: string } | undefined)?.message;
  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="sr-only">Actions</legend>
      {fields.length === 0 && <p className="text-xs text-slate-500 dark:text-slate-400">No actions: after the contract both sides only keep it alive.</p>}
      <ol className="flex flex-col gap-2" aria-label="Actions">
        {fields.map((field, index) => (
          <li key={field.id} aria-label={`Action ${index + 1}`} className="grid grid-cols-[6rem_7rem_1fr_auto] items-start gap-2 rounded-md border border-slate-200 p-2 dark:border-slate-800">
            <Input label="At (ms)" type="number" min={0} mono error={errorAt(`actions.${index}.atMs`)} {...register(`actions.${index}.atMs`, numberField)} />
            <Select
              label="By"
              options={[
                { value: 'sink', label: 'sink' },
                { value: 'source', label: 'source' },
              ]}
              {...register(`actions.${index}.by`)}
            />
            <Select label="Starts" options={ACTION_OPTIONS} error={errorAt(`actions.${index}.action`)} {...register(`actions.${index}.action`)} />
            <div className="pt-6">
              <Button variant="ghost" size="sm" aria-label={`Remove action ${index + 1}`} onClick={() => remove(index)}>
                ✕
              </Button>
            </div>
          </li>
        ))}
      </ol>
      <div>
        <Button variant="secondary" size="sm" onClick={() => append({ atMs: 2_000, by: 'sink', action: 'get_source_cap_extended' })}>
          + Add an action
        </Button>
      </div>
    </fieldset>
  );
}
