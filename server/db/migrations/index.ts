import { Migration20250601000000Initial } from './Migration20250601000000Initial.ts';

/** Every migration in order; the migrator runs the ones a database has not seen. Append new ones. */
export const migrationsList = [{ name: 'Migration20250601000000Initial', class: Migration20250601000000Initial }];
