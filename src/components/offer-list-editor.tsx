/**
 * The one editor of a source's offers (Offers page, Library caps and request vectors, the Bench's
 * SPR and EPR lists): a row per PDO in object-position order with its kind and numbers in the
 * units of the PDO's fields; add, remove, reorder, change kind. Controlled: the caller holds the
 * list (numbers may be NaN while a field is empty) and validates it with the engine's
 * `offerListSchema`.
 */
import { type ReactNode, useState } from 'react';
import { Button } from './button.tsx';
import { Input } from './input.tsx';
import { Select } from './select.tsx';
import { defaultOffer, type OfferInput, type OfferKind } from '../../shared/rules/offer-input.ts';
import { numberFromInput, numberInputText, offerFields, offerKindOptions, type OfferNumberKey } from '../lib/offers-form/offer-fields.ts';

/** USB PD allows 7 SPR and 6 EPR object positions. */
export const MAX_OFFERS = 13;

export type OfferListEditorProps = {
  offers: readonly OfferInput[];
  onChange(offers: OfferInput[]): void;
  /** The message for one field, e.g. from a form's errors or a zod issue path. */
  errorOf?(index: number, field: OfferNumberKey): string | undefined;
  /** A message about the whole list ("add at least one offer"). */
  listError?: string;
  disabled?: boolean;
  /** The list's accessible name. */
  listLabel?: string;
  /** The object position of the first row: 1, or 8 for a list of EPR offers. */
  firstPosition?: number;
  /** At most this many rows (USB PD R3.2 §6.4.1: 7 in a Source_Capabilities message). */
  maxOffers?: number;
  /** At least this many rows: 1 for a source's offers, 0 where the list may be empty (EPR offers). */
  minOffers?: number;
  /** The kinds "New offer" offers (every kind unless given). */
  addKinds?: readonly OfferKind[];
  /** Shown in place of the rows when there are none. */
  emptyNote?: ReactNode;
};

export function OfferListEditor({
  offers,
  onChange,
  errorOf,
  listError,
  disabled,
  listLabel = 'Power data objects',
  firstPosition = 1,
  maxOffers = MAX_OFFERS,
  minOffers = 1,
  addKinds,
  emptyNote,
}: OfferListEditorProps) {
  const addOptions = addKinds ? offerKindOptions.filter((option) => addKinds.includes(option.value)) : offerKindOptions;
  const [kindToAdd, setKindToAdd] = useState<OfferKind>(addOptions[0]?.value ?? 'fixed');
  const replace = (index: number, offer: OfferInput) => onChange(offers.map((o, i) => (i === index ? offer : o)));
  const move = (from: number, to: number) => {
    const next = [...offers];
    const [moved] = next.splice(from, 1);
    next.splice(to, 0, moved!);
    onChange(next);
  };
  return (
    <div className="space-y-3">
      {offers.length === 0 && emptyNote && <p className="text-xs text-slate-500 dark:text-slate-400">{emptyNote}</p>}
      <ol className="space-y-3" aria-label={listLabel}>
        {offers.map((offer, index) => (
          // biome-ignore lint/suspicious/noArrayIndexKey: rows are object positions; every field is controlled, so a move or a removal redraws the values
          <li key={index} className="rounded-md border border-slate-200 p-3 dark:border-slate-800" aria-label={`Offer ${index + firstPosition}`}>
            {/* Two lines whatever the width: what the object is (and the buttons), then its numbers. */}
            <div className="flex items-end gap-3">
              <span className="mb-2 w-6 font-mono text-xs text-slate-500 tabular" title="Object position">
                {index + firstPosition}
              </span>
              <Select
                label="Kind"
                className="w-32"
                disabled={disabled}
                options={offerKindOptions}
                value={offer.kind}
                onChange={(event) => replace(index, defaultOffer(event.target.value as OfferKind))}
              />
              <div className="mb-0.5 ml-auto flex gap-1">
                <Button variant="ghost" size="sm" aria-label={`Move offer ${index + firstPosition} up`} disabled={disabled || index === 0} onClick={() => move(index, index - 1)}>
                  ↑
                </Button>
                <Button variant="ghost" size="sm" aria-label={`Move offer ${index + firstPosition} down`} disabled={disabled || index === offers.length - 1} onClick={() => move(index, index + 1)}>
                  ↓
                </Button>
                <Button
                  variant="ghost"
                  size="sm"
                  aria-label={`Remove offer ${index + firstPosition}`}
                  disabled={disabled || offers.length <= minOffers}
                  onClick={() => onChange(offers.filter((_, i) => i !== index))}
                >
                  Remove
                </Button>
              </div>
            </div>
            <div className="mt-2 grid grid-cols-3 items-start gap-2 pl-9">
              {offerFields[offer.kind].map((f) => (
                <Input
                  key={f.name}
                  label={f.label}
                  type="number"
                  step={f.step}
                  mono
                  className="min-w-0"
                  disabled={disabled}
                  error={errorOf?.(index, f.name)}
                  value={numberInputText((offer as Record<string, unknown>)[f.name])}
                  onChange={(event) => replace(index, { ...offer, [f.name]: numberFromInput(event.target.value) } as OfferInput)}
                />
              ))}
            </div>
          </li>
        ))}
      </ol>
      {listError && (
        <p role="alert" className="text-xs font-medium text-red-600">
          {listError}
        </p>
      )}
      <div className="flex flex-wrap items-end gap-2">
        <Select label="New offer" className="w-36" disabled={disabled} options={addOptions} value={kindToAdd} onChange={(event) => setKindToAdd(event.target.value as OfferKind)} />
        <Button variant="secondary" disabled={disabled || offers.length >= maxOffers} onClick={() => onChange([...offers, defaultOffer(kindToAdd)])}>
          Add offer
        </Button>
      </div>
    </div>
  );
}
