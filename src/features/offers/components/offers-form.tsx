import { useState } from 'react';
import { useFieldArray, useWatch, type Path, type UseFormReturn } from 'react-hook-form';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Input } from '../../../components/input.tsx';
import { RatingText } from '../../../components/mono.tsx';
import { Select } from '../../../components/select.tsx';
import { defaultOffer, type OfferKind } from '../../../../shared/rules/offer-input.ts';
import { offerFields, offerKindOptions } from '../../../lib/offers-form/offer-fields.ts';
import { cableOptions, type OffersFormValues } from '../lib/offers-form.ts';

/** An example in the form adapters print it; U+2393 is the DC symbol. */
const exampleRating = '5V\u23933A 9V\u23933A 15V\u23933A 20V\u23933.25A 65W max';

/** The source's offers in object-position order: add, remove, reorder, change kind; and how to check them. */
export function OffersForm({ form }: { form: UseFormReturn<OffersFormValues> }) {
  const { control, register, formState } = form;
  const { fields, append, remove, move, update } = useFieldArray({ control, name: 'offers' });
  const [kindToAdd, setKindToAdd] = useState<OfferKind>('fixed');
  const rating = useWatch({ control, name: 'label' }) ?? '';
  const errors = formState.errors;
  const offerErrors = (index: number) => (errors.offers?.[index] ?? {}) as Record<string, { message?: string } | undefined>;

  return (
    <Card aria-labelledby="offers-form-heading">
      <CardHeader
        title={<span id="offers-form-heading">Offers</span>}
        description="The source's power data objects, in object-position order. Voltages in mV, currents in mA, as the PDO fields count them."
      />
      <CardBody className="space-y-4">
        <ol className="space-y-3" aria-label="Power data objects">
          {fields.map((field, index) => (
            <li key={field.id} className="rounded-md border border-slate-200 p-3 dark:border-slate-800" aria-label={`Offer ${index + 1}`}>
              <div className="flex flex-wrap items-end gap-3">
                <span className="mb-2 w-6 font-mono text-xs text-slate-500 tabular">{index + 1}</span>
                <Select label="Kind" className="w-32" options={offerKindOptions} value={field.kind} onChange={(event) => update(index, defaultOffer(event.target.value as OfferKind))} />
                {offerFields[field.kind].map((f) => (
                  <Input
                    key={f.name}
                    label={f.label}
                    type="number"
                    step={f.step}
                    mono
                    className="w-36"
                    error={offerErrors(index)[f.name]?.message}
                    {...register(`offers.${index}.${f.name}` as Path<OffersFormValues>, { valueAsNumber: true })}
                  />
                ))}
                <div className="mb-0.5 ml-auto flex gap-1">
                  <Button variant="ghost" size="sm" aria-label={`Move offer ${index + 1} up`} disabled={index === 0} onClick={() => move(index, index - 1)}>
                    ↑
                  </Button>
                  <Button variant="ghost" size="sm" aria-label={`Move offer ${index + 1} down`} disabled={index === fields.length - 1} onClick={() => move(index, index + 1)}>
                    ↓
                  </Button>
                  <Button variant="ghost" size="sm" aria-label={`Remove offer ${index + 1}`} disabled={fields.length === 1} onClick={() => remove(index)}>
                    Remove
                  </Button>
                </div>
              </div>
            </li>
          ))}
        </ol>
        {errors.offers?.root?.message && (
          <p role="alert" className="text-xs font-medium text-red-600">
            {errors.offers.root.message}
          </p>
        )}
        <div className="flex flex-wrap items-end gap-2">
          <Select label="New offer" className="w-36" options={offerKindOptions} value={kindToAdd} onChange={(event) => setKindToAdd(event.target.value as OfferKind)} />
          <Button variant="secondary" disabled={fields.length >= 13} onClick={() => append(defaultOffer(kindToAdd))}>
            Add offer
          </Button>
        </div>
        <div className="grid gap-4 border-t border-slate-200 pt-4 sm:grid-cols-2 dark:border-slate-800">
          <Input label="Declared PDP (W)" mono inputMode="numeric" hint="Leave empty to infer it from the offers." error={errors.pdpW?.message} {...register('pdpW')} />
          <Select label="Cable" options={cableOptions} error={errors.cable?.message} {...register('cable')} />
          {/* An input draws the text in the page font, which has no DC symbol: the hint shows it rendered. */}
          <Input
            label="Printed rating"
            className="sm:col-span-2"
            placeholder="As printed on the adapter"
            hint={
              rating.trim() === '' ? (
                <>
                  For example <RatingText value={exampleRating} className="font-mono text-slate-700 dark:text-slate-300" />
                </>
              ) : (
                <span>
                  As printed: <RatingText value={rating} className="font-mono text-slate-700 dark:text-slate-300" />
                </span>
              )
            }
            error={errors.label?.message}
            {...register('label')}
          />
          <label className="flex items-center gap-2 text-sm text-slate-700 sm:col-span-2 dark:text-slate-300">
            <input type="checkbox" className="size-4 accent-amber-500" {...register('epr')} />
            EPR_Source_Capabilities (EPR offers from position 8)
          </label>
        </div>
      </CardBody>
    </Card>
  );
}
