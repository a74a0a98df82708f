import { Controller, useFormContext, type FieldErrors } from 'react-hook-form';
import { offerInputOf, type OfferInput, type OfferKind } from '../../../../shared/rules/offer-input.ts';
import { resolveCaps } from '../../../../shared/sim/caps.ts';
import { OfferListEditor } from '../../../components/offer-list-editor.tsx';
import { Select } from '../../../components/select.tsx';
import type { OfferNumberKey } from '../../../lib/offers-form/offer-fields.ts';
import { useSourceDevices } from '../../../lib/api/get-devices.ts';
import type { BenchFormValues } from '../lib/form-model.ts';

function offersOfDevice(pdos: readonly string[]): OfferInput[] | null {
  const caps = resolveCaps({ pdos: [...pdos] });
  return caps.ok ? caps.pdos.map(offerInputOf) : null;
}

type OfferListName = 'offers' | 'eprOffers';

function fieldError(errors: FieldErrors<BenchFormValues>, name: OfferListName, index: number, key: OfferNumberKey): string | undefined {
  const row = errors[name]?.[index] as Record<string, { message?: string } | undefined> | undefined;
  return row?.[key]?.message;
}

/** EPR objects from position 8 are fixed supplies or an EPR AVS (USB PD R3.2 §6.4.1, from memory). */
const eprKinds: readonly OfferKind[] = ['fixed', 'epr-avs'];

/** The demo sources of `GET /api/devices`, each loading its offers into the SPR list. */
function DeviceLoader({ onLoad }: { onLoad(offers: OfferInput[]): void }) {
  const devices = useSourceDevices();
  return (
    <Select
      label="Load offers from a demo device"
      className="min-w-64"
      value=""
      options={[
        { value: '', label: devices.isLoading ? 'Loading devices…' : 'Choose a device…' },
        ...(devices.data ?? []).map((device) => ({ value: String(device.id), label: `${device.name} (${device.pdpW} W)` })),
      ]}
      onChange={(event) => {
        const device = devices.data?.find((item) => String(item.id) === event.target.value);
        const offers = device ? offersOfDevice(device.pdos) : null;
        if (offers) onLoad(offers);
      }}
      hint={devices.isError ? 'The device list could not be loaded; enter the offers by hand.' : undefined}
    />
  );
}

/**
 * The Bench's lists of the source's offers in the shared offer editor: `offers` (positions 1–7,
 * at least one, or a demo device's) and `eprOffers` (from position 8, at most 4, may be empty).
 */
export function SourceOffersField({ name = 'offers' }: { name?: OfferListName }) {
  const { control } = useFormContext<BenchFormValues>();
  const epr = name === 'eprOffers';
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, formState }) => (
        <div className="flex flex-col gap-3">
          {!epr && <DeviceLoader onLoad={field.onChange} />}
          <OfferListEditor
            offers={field.value}
            onChange={field.onChange}
            errorOf={(index, key) => fieldError(formState.errors, name, index, key)}
            listError={formState.errors[name]?.message ?? formState.errors[name]?.root?.message}
            listLabel={epr ? 'EPR offers from object position 8' : 'Offers in object-position order'}
            firstPosition={epr ? 8 : 1}
            maxOffers={epr ? 4 : 7}
            minOffers={epr ? 0 : 1}
            addKinds={epr ? eprKinds : undefined}
            emptyNote={epr ? 'No EPR offers: the source offers SPR only (up to 20 V).' : undefined}
          />
        </div>
      )}
    />
  );
}
