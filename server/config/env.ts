import { z } from 'zod';
import { zodMessage } from '../../shared/core/zod-message.ts';

const flag = z.enum(['0', '1', 'true', 'false', 'on', 'off', 'yes', 'no']).transform((value) => ['1', 'true', 'on', 'yes'].includes(value));

const envSchema = z
  .object({
    PORT: z.coerce.number().int().min(0).max(65_535).default(3000),
    HOST: z.string().min(1).optional(),
    PARLEY_DATA: z.string().min(1).default('./data'),
    PARLEY_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
    /** Demo organisation on an empty database; default on, except in production where it must be asked for. */
    PARLEY_DEMO: flag.optional(),
    /** Express `trust proxy`: the reverse proxies in front (a hop count, addresses or `loopback`); unset, X-Forwarded-For is ignored. */
    PARLEY_TRUST_PROXY: z.string().min(1).optional(),
    SMTP_URL: z.url({ protocol: /^smtps?$/ }).optional(),
    MAIL_FROM: z.string().min(3).default('Parley <parley@localhost>'),
    NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
    PUBLIC_URL: z.url({ protocol: /^https?$/ }).optional(),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
    /** Property sandbox: `bubblewrap` (required), `fallback` (never bubblewrap) or `auto` (bubblewrap where it works). */
    PARLEY_SANDBOX: z.enum(['auto', 'bubblewrap', 'fallback']).default('auto'),
    /** `postgres://…`: PostgreSQL and the shared job queue (a team deployment); unset: SQLite in PARLEY_DATA. */
    DATABASE_URL: z
      .string()
      .regex(/^postgres(ql)?:\/\//, 'must be a postgres:// URL (leave it unset for SQLite)')
      .optional(),
    /** S3-compatible endpoint for trace files, e.g. `https://s3.eu-west-1.amazonaws.com`; with S3_BUCKET. */
    S3_URL: z.url({ protocol: /^https?$/ }).optional(),
    S3_BUCKET: z
      .string()
      .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, 'must be an S3 bucket name')
      .optional(),
    S3_REGION: z.string().min(1).default('us-east-1'),
    /** Key prefix inside the bucket. */
    S3_PREFIX: z
      .string()
      .regex(/^[\w./-]*$/, 'letters, digits, ".", "_", "-" and "/" only')
      .default('traces/'),
    /**
     * `off`: this server queues jobs and relays their progress but runs none, leaving them to
     * `parley worker` processes (a team deployment only: with SQLite nothing else would run them).
     */
    PARLEY_RUN_JOBS: flag.default(true),
  })
  .refine((env) => (env.S3_URL === undefined) === (env.S3_BUCKET === undefined), { message: 'set S3_URL and S3_BUCKET together', path: ['S3_BUCKET'] })
  .refine((env) => env.PARLEY_RUN_JOBS || env.DATABASE_URL !== undefined, {
    message: 'off needs DATABASE_URL (a team deployment, where parley worker processes run the jobs); with SQLite the server runs its jobs itself',
    path: ['PARLEY_RUN_JOBS'],
  })
  .transform((env) => ({
    ...env,
    PARLEY_DEMO: env.PARLEY_DEMO ?? env.NODE_ENV !== 'production',
    /** PARLEY_DEMO was set explicitly (a production demo deployment knows what it does). */
    demoAskedFor: env.PARLEY_DEMO === true,
    trustProxy: env.PARLEY_TRUST_PROXY === undefined ? false : /^\d+$/.test(env.PARLEY_TRUST_PROXY) ? Number(env.PARLEY_TRUST_PROXY) : env.PARLEY_TRUST_PROXY,
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
  if (!parsed.success) throw new Error(`Invalid environment: ${zodMessage(parsed.error, { where: 'env' })}`);
  return parsed.data;
}
