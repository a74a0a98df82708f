import { z } from 'zod';
import { zodMessage } from '../errors.ts';

const flag = z
  .enum(['0', '1', 'true', 'false', 'on', 'off', 'yes', 'no'])
  .transform((value) => ['1', 'true', 'on', 'yes'].includes(value));

const envSchema = z
  .object({
    PORT: z.coerce.number().int().min(0).max(65_535).default(3000),
    HOST: z.string().min(1).optional(),
    PARLEY_DATA: z.string().min(1).default('./data'),
    PARLEY_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
    PARLEY_DEMO: flag.default(true),
    SMTP_URL: z.url({ protocol: /^smtps?$/ }).optional(),
    MAIL_FROM: z.string().min(3).default('Parley <parley@localhost>'),
    NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
    PUBLIC_URL: z.url({ protocol: /^https?$/ }).optional(),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  })
  .transform((env) => ({
    ...env,
    PUBLIC_URL: (env.PUBLIC_URL ?? `http://localhost:${env.PORT}`).replace(/\/+$/, ''),
    /** Set when PUBLIC_URL was not given, so the real port can replace PORT 0 after listening. */
    publicUrlDefaulted: env.PUBLIC_URL === undefined,
  }));

export type Env = z.infer<typeof envSchema>;

/**
 * The server's environment, validated once at start-up. Empty strings count as unset, so
 * `SMTP_URL=` in a shell file means "use the built-in outbox".
 */
export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const cleaned = Object.fromEntries(Object.entries(source).filter(([, value]) => value !== undefined && value !== ''));
  const parsed = envSchema.safeParse(cleaned);
  if (!parsed.success) throw new Error(`Invalid environment: ${zodMessage(parsed.error, 'env')}`);
  return parsed.data;
}
