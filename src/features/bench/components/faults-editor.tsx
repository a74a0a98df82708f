import { get, useFieldArray, useFormContext, useFormState } from 'react-hook-form';
import { Button } from '../../../components/button.tsx';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import type { Fault } from '../../../../shared/sim/scenario.ts';
import type { BenchFormValues } from '../lib/form-model.ts';
import { optionalNumberField, optionalTextField } from './form-fields.ts';

const KINDS: { value: Fault['kind']; label: string }[] = [
  { value: 'drop', label: 'drop — never received' },
  { value: 'corrupt', label: 'corrupt — bad CRC, no GoodCRC' },
  { value: 'delay', label: 'delay — sent late' },
  { value: 'reject', label: 'reject — source answers Reject' },
  { value: 'wait', label: 'wait — source answers Wait' },
  { value: 'no-ps-rdy', label: 'no-ps-rdy — source never sends PS_RDY' },
  { value: 'silent', label: 'silent — that side stops talking' },
];

const MESSAGE_TYPES = [
  'GoodCRC',
  'Source_Capabilities',
  'Request',
  'Accept',
  'Reject',
  'Wait',
  'PS_RDY',
  'Soft_Reset',
  'Get_Source_Cap',
  'Get_Sink_Cap',
  'Sink_Capabilities',
  'EPR_Mode',
  'EPR_Source_Capabilities',
  'EPR_Request',
  'EPR_KeepAlive',
  'EPR_KeepAlive_Ack',
  'EPR_Get_Source_Cap',
  'Vendor_Defined',
  'PR_Swap',
  'DR_Swap',
  'VCONN_Swap',
  'Get_Status',
  'Status',
  'Get_PPS_Status',
  'PPS_Status',
  'Get_Source_Cap_Extended',
  'Source_Capabilities_Extended',
];

/** The faults to inject, each selected by side, message type and nth, or by time. */
export function FaultsEditor() {
  const { control, register } = useFormContext<BenchFormValues>();
  // Subscribed here: the form panel is memoised, so errors reach the fields through this hook.
  const formState = useFormState({ control });
  const { fields, append, remove } = useFieldArray({ control, name: 'faults' });
  const errorAt = (path: string): string | undefined => (get(formState.errors, path) as { message?: string } | undefined)?.message;

  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="sr-only">Faults</legend>
      {fields.length === 0 && <p className="text-xs text-slate-500 dark:text-slate-400">No faults: both sides behave as the specification asks.</p>}
      <datalist id="bench-message-types">
        {MESSAGE_TYPES.map((type) => (
          <option key={type} value={type} />
        ))}
      </datalist>
      <ol className="flex flex-col gap-2" aria-label="Faults">
        {fields.map((field, index) => {
          return (
            <li key={field.id} aria-label={`Fault ${index + 1}`} className="flex flex-col gap-2 rounded-md border border-slate-200 bg-slate-50/60 p-2 dark:border-slate-800 dark:bg-slate-950/40">
              <div className="flex items-end gap-2">
                <Select label="Fault" className="flex-1" options={KINDS} error={errorAt(`faults.${index}.kind`)} {...register(`faults.${index}.kind`)} />
                <Select
                  label="From"
                  className="w-28"
                  options={[
                    { value: '', label: 'either' },
                    { value: 'source', label: 'source' },
                    { value: 'sink', label: 'sink' },
                  ]}
                  error={errorAt(`faults.${index}.from`)}
                  {...register(`faults.${index}.from`, optionalTextField)}
                />
                <Button variant="ghost" size="sm" aria-label={`Remove fault ${index + 1}`} onClick={() => remove(index)}>
                  ✕
                </Button>
              </div>
              <div className="grid grid-cols-[minmax(0,1.6fr)_repeat(3,minmax(0,1fr))] gap-2">
                <Input
                  label="Message type"
                  list="bench-message-types"
                  placeholder="any"
                  mono
                  error={errorAt(`faults.${index}.messageType`)}
                  {...register(`faults.${index}.messageType`, optionalTextField)}
                />
                <Input label="nth" type="number" min={1} placeholder="every" mono error={errorAt(`faults.${index}.nth`)} {...register(`faults.${index}.nth`, optionalNumberField)} />
                <Input label="At (ms)" type="number" min={0} placeholder="—" mono error={errorAt(`faults.${index}.atMs`)} {...register(`faults.${index}.atMs`, optionalNumberField)} />
                <Input
                  label="Delay (ms)"
                  type="number"
                  min={0}
                  placeholder="delay only"
                  mono
                  error={errorAt(`faults.${index}.delayMs`)}
                  {...register(`faults.${index}.delayMs`, optionalNumberField)}
                />
              </div>
            </li>
          );
        })}
      </ol>
      <div>
        <Button variant="secondary" size="sm" onClick={() => append({ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 1 })}>
          + Add a fault
        </Button>
      </div>
    </fieldset>
  );
}
