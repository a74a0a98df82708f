import { Select } from '../../../components/select.tsx';
import { getIn, templateFor, vectorKinds, type Path, type VectorKindName, type VectorObject } from '../lib/vector-model.ts';
import type { Device } from '../../../../shared/api/index.ts';
import { ListInput, TextInput } from './form-controls.tsx';
import { KindFields } from './kind-fields.tsx';

export type VectorFormProps = {
  value: VectorObject;
  onChange: (next: VectorObject) => void;
  isNew: boolean;
  devices: readonly Device[];
  deviceId: number | null;
  onDeviceChange: (deviceId: number | null) => void;
  disabled?: boolean;
  setIn: (value: VectorObject, path: Path, next: unknown) => VectorObject;
};

const kindOptions = vectorKinds.map((k) => ({ value: k, label: k }));

/** The form half of the vector page: common fields, then the fields of the vector's kind. */
export function VectorForm({ value, onChange, isNew, devices, deviceId, onDeviceChange, disabled, setIn }: VectorFormProps) {
  const set = (path: Path, next: unknown) => onChange(setIn(value, path, next));
  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextInput
          label="Id"
          hint={isNew ? 'Lower-case words separated by "/"; it cannot change once saved.' : 'Fixed once saved.'}
          mono
          disabled={disabled || !isNew}
          value={value.id}
          onChange={(x) => set(['id'], x ?? '')}
        />
        <Select
          label="Kind"
          disabled={disabled || !isNew}
          options={kindOptions}
          value={String(value.kind ?? 'caps')}
          onChange={(event) => {
            const kind = event.target.value as VectorKindName;
            const base = {
              id: typeof value.id === 'string' ? value.id : undefined,
              title: typeof value.title === 'string' ? value.title : undefined,
              ref: typeof value.ref === 'string' ? value.ref : undefined,
              tags: Array.isArray(value.tags) ? (value.tags as string[]) : [],
            };
            onChange(templateFor(kind, base));
          }}
        />
        <TextInput label="Title" className="sm:col-span-2" disabled={disabled} value={value.title} onChange={(x) => set(['title'], x ?? '')} />
        <TextInput
          label="Where the expected value comes from"
          hint='A specification with revision and section, "common practice" or "from memory: …".'
          className="sm:col-span-2"
          disabled={disabled}
          value={value.ref}
          onChange={(x) => set(['ref'], x ?? '')}
        />
        <ListInput label="Tags" disabled={disabled} value={getIn(value, ['tags'])} onChange={(x) => set(['tags'], x ?? [])} />
        <Select
          label="Device under test"
          disabled={disabled}
          options={[{ value: '', label: 'None' }, ...devices.map((d) => ({ value: String(d.id), label: d.name }))]}
          value={deviceId === null ? '' : String(deviceId)}
          onChange={(event) => onDeviceChange(event.target.value === '' ? null : Number(event.target.value))}
        />
      </div>
      <KindFields v={value} set={set} disabled={disabled} />
    </div>
  );
}
