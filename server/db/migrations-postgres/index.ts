import { Migration20261204170000PostgresInitial } from './Migration20261204170000PostgresInitial.ts';

/** Every PostgreSQL migration in order (the same schema as ../migrations, in PostgreSQL's dialect). Append new ones. */
export const postgresMigrationsList = [{ name: 'Migration20261204170000PostgresInitial', class: Migration20261204170000PostgresInitial }];
