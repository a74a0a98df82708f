import { z } from 'zod';

/** The server's rule: at least 10 characters. */
export const minPasswordLength = 10;

export const newPasswordSchema = z
  .object({
    password: z.string().min(minPasswordLength, `Use at least ${minPasswordLength} characters.`).max(200, 'Use at most 200 characters.'),
    confirm: z.string(),
  })
  .refine((value) => value.password === value.confirm, { path: ['confirm'], message: 'The two passwords differ.' });
