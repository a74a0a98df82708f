/** register() options for the Bench form's inputs: numbers stay numbers, empty optionals stay absent. */

/** A required number: empty becomes NaN, which the schema reports as "enter a number". */
export const numberField = { setValueAs: (value: unknown) => (value === '' || value === null || value === undefined ? Number.NaN : Number(value)) };

/** An optional number: empty means "not set". */
export const optionalNumberField = { setValueAs: (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value)) };

/** An optional text or choice: empty means "not set". */
export const optionalTextField = { setValueAs: (value: unknown) => (value === '' || value === null || value === undefined ? undefined : String(value)) };
