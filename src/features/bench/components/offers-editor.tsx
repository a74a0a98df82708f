import { useFieldArray, useFormContext, useFormState, type FieldErrors } from 'react-hook-form';
import { defaultOffer, offerInputOf, type OfferInput, type OfferKind } from '../../../../shared/rules/offer-input.ts';
import { resolveCaps } from '../../../../shared/sim/caps.ts';
import { Button } from '../../../components/button.tsx';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import { offerFields, offerKindLabels, offerKindOptions, offerKinds, type OfferNumberKey } from '../../../lib/offers-form/offer-fields.ts';
import { useSourceDevices } from '../../../lib/api/get-devices.ts';
import type { BenchFormValues } from '../lib/form-model.ts';
import { numberField } from './form-fields.ts';

function offersOfDevice(pdos: readonly string[]): OfferInput[] | null {
  const caps = resolveCaps({ pdos: [...pdos] });
  return caps.ok ? caps.pdos.map(offerInputOf) : null;
}

function fieldError(errors: FieldErrors<BenchFormValues>, name: OfferListName, index: number, key: OfferNumberKey): string | undefined {
  const row = errors[name]?.[index] as Record<string, { message?: string } | undefined> | undefined;
  return row?.[key]?.message;
}

type OfferListName = 'offers' | 'eprOffers';

/**
 * A list of the source's offers, one row per object position, in order; add, remove, reorder, or (SPR
 * list) load a demo device. `eprOffers` holds the EPR objects from position 8, at most 4.
 */
export function OffersEditor({ name = 'offers' }: { name?: OfferListName }) {
  const { control, register } = useFormContext<BenchFormValues>();
  const formState = useFormState({ control });
  const { fields, append, remove, move, replace, update } = useFieldArray({ control, name });
  const devices = useSourceDevices();
  const listError = formState.errors[name]?.message ?? formState.errors[name]?.root?.message;
  const epr = name === 'eprOffers';
  const firstPosition = epr ? 8 : 1;
  const maxOffers = epr ? 4 : 7;

  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="sr-only">{epr ? 'EPR offers' : 'Source offers'}</legend>
      {epr && fields.length === 0 && <p className="text-xs text-slate-500 dark:text-slate-400">No EPR offers: the source offers SPR only (up to 20 V).</p>}
      {!epr && (
        <div className="flex flex-wrap items-end gap-3">
          <Select
            label="Load offers from a demo device"
            className="min-w-64 flex-1"
            value=""
            options={[
              { value: '', label: devices.isLoading ? 'Loading devices…' : 'Choose a device…' },
              ...(devices.data ?? []).map((device) => ({ value: String(device.id), label: `${device.name} (${device.pdpW} W)` })),
            ]}
            onChange={(event) => {
              const device = devices.data?.find((item) => String(item.id) === event.target.value);
              const offers = device ? offersOfDevice(device.pdos) : null;
              if (offers) replace(offers);
            }}
            hint={devices.isError ? 'The device list could not be loaded; enter the offers by hand.' : undefined}
          />
        </div>
      )}
      <ol className="flex flex-col gap-2" aria-label={epr ? 'EPR offers from object position 8' : 'Offers in object-position order'}>
        {fields.map((field, index) => {
          const kind = field.kind;
          return (
            <li
              key={field.id}
              className="flex flex-col gap-2 rounded-md border border-slate-200 bg-slate-50/60 p-2 dark:border-slate-800 dark:bg-slate-950/40"
              aria-label={`Offer ${index + firstPosition}: ${offerKindLabels[kind]}`}
            >
              <div className="flex items-end gap-2">
                <span className="w-7 pb-2 font-mono text-xs text-slate-500" title="Object position">
                  #{index + firstPosition}
                </span>
                <Select label="Kind" className="w-36" value={kind} options={offerKindOptions} onChange={(event) => update(index, defaultOffer(event.target.value as OfferKind))} />
                <span className="grow" />
                <Button variant="ghost" size="sm" aria-label={`Move offer ${index + firstPosition} up`} disabled={index === 0} onClick={() => move(index, index - 1)}>
                  ↑
                </Button>
                <Button variant="ghost" size="sm" aria-label={`Move offer ${index + firstPosition} down`} disabled={index === fields.length - 1} onClick={() => move(index, index + 1)}>
                  ↓
                </Button>
                <Button variant="ghost" size="sm" aria-label={`Remove offer ${index + firstPosition}`} disabled={!epr && fields.length <= 1} onClick={() => remove(index)}>
                  ✕
                </Button>
              </div>
              <div className="grid grid-cols-3 gap-2 pl-9">
                {offerFields[kind].map(({ name: key, label, step }) => (
                  <Input
                    key={key}
                    label={label}
                    type="number"
                    mono
                    step={step}
                    min={0}
                    error={fieldError(formState.errors, name, index, key)}
                    {...register(`${name}.${index}.${key}` as `offers.${number}.voltageMv`, numberField)}
                  />
                ))}
              </div>
            </li>
          );
        })}
      </ol>
      {listError && (
        <p role="alert" className="text-xs font-medium text-red-600 dark:text-red-400">
          {listError}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-2">
        <span className="text-xs text-slate-500 dark:text-slate-400">Add:</span>
        {(epr ? offerKinds.filter((kind) => kind === 'fixed' || kind === 'epr-avs') : offerKinds).map((kind) => (
          <Button key={kind} variant="secondary" size="sm" disabled={fields.length >= maxOffers} onClick={() => append(defaultOffer(kind))}>
            + {epr ? 'EPR ' : ''}
            {offerKindLabels[kind]}
          </Button>
        ))}
      </div>
    </fieldset>
  );
}
