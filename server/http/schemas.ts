/** Zod schemas that many routes share: a numeric `:id`, a page of a list, an e-mail address. */
import { z } from 'zod';

/** `:id` of a row with an integer key. */
export const idParams = z.object({ id: z.coerce.number().int().positive() });

/** `?page=&pageSize=` of a list; pages count from 1. */
export const pageQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

/** An e-mail address, trimmed and lower-cased, so one person has one spelling of it. */
export const emailSchema = z.string().trim().toLowerCase().pipe(z.email('must be an e-mail address').max(254));
