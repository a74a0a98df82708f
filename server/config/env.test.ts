import { describe, expect, it } from 'vitest';
import { loadEnv } from './env.ts';

describe('loadEnv', () => {
  it('fills the defaults', () => {
    const env = loadEnv({});
    expect(env).toMatchObject({ PORT: 3000, PARLEY_DATA: './data', PARLEY_DEMO: true, NODE_ENV: 'development', PUBLIC_URL: 'http://localhost:3000' });
    expect(env.SMTP_URL).toBeUndefined();
  });

  it('reads the flags and treats empty values as unset', () => {
    const env = loadEnv({ PORT: '8080', PARLEY_DEMO: '0', SMTP_URL: '', PUBLIC_URL: 'https://parley.kestrel.example/' });
    expect(env).toMatchObject({ PORT: 8080, PARLEY_DEMO: false, PUBLIC_URL: 'https://parley.kestrel.example' });
    expect(env.SMTP_URL).toBeUndefined();
  });

  it('names the bad variable', () => {
    expect(() => loadEnv({ PORT: 'eighty' })).toThrow(/^Invalid environment: PORT: /);
    expect(() => loadEnv({ PARLEY_SECRET: 'short' })).toThrow('PARLEY_SECRET: must be at least 32 characters');
    expect(() => loadEnv({ SMTP_URL: 'http://mail.example' })).toThrow(/SMTP_URL: /);
  });

  it('lets a team deployment leave its jobs to parley worker processes, and refuses that on SQLite', () => {
    expect(loadEnv({}).PARLEY_RUN_JOBS).toBe(true);
    expect(loadEnv({ DATABASE_URL: 'postgres://parley@db.kestrel.example/parley', PARLEY_RUN_JOBS: 'off' }).PARLEY_RUN_JOBS).toBe(false);
    expect(() => loadEnv({ PARLEY_RUN_JOBS: 'off' })).toThrow('PARLEY_RUN_JOBS: off needs DATABASE_URL');
  });
});
