/**
 * The API contract: every shape the server presents, the limits it enforces, its error codes and
 * the role groups. Types and constants only; server presenters and client fetchers both import it.
 */
export * from './devices.ts';
export * from './errors.ts';
export * from './limits.ts';
export * from './people.ts';
export * from './properties.ts';
export * from './roles.ts';
export * from './runs.ts';
export * from './traces.ts';
export * from './vectors.ts';
