import { Controller, useWatch, type UseFormReturn } from 'react-hook-form';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Input } from '../../../components/input.tsx';
import { RatingText } from '../../../components/mono.tsx';
import { Select } from '../../../components/select.tsx';
import { OfferListEditor } from '../../../components/offer-list-editor.tsx';
import { cableOptions, type OffersFormValues } from '../lib/offers-form.ts';

/** An example in the form adapters print it; U+2393 is the DC symbol. */
const exampleRating = '5V\u23933A 9V\u23933A 15V\u23933A 20V\u23933.25A 65W max';

/** The source's offers in object-position order: add, remove, reorder, change kind; and how to check them. */
export function OffersForm({ form }: { form: UseFormReturn<OffersFormValues> }) {
  const { control, register, formState } = form;
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
        <Controller
          control={control}
          name="offers"
          render={({ field }) => (
            <OfferListEditor
              offers={field.value}
              onChange={field.onChange}
              errorOf={(index, name) => offerErrors(index)[name]?.message}
              listError={errors.offers?.root?.message ?? errors.offers?.message}
            />
          )}
        />
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
