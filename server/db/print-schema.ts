/**
 * Prints the SQL that would bring a migrated database in line with the entities: the body of the
 * next migration. Run: `npx tsx server/db/print-schema.ts`. Prints nothing when they agree.
 */
import { openOrm } from './orm.ts';

const orm = await openOrm({ dbName: ':memory:' });
const sql = await orm.getSchemaGenerator().getUpdateSchemaSQL({ wrap: false });
process.stdout.write(sql.trim() === '' ? '' : `${sql.trim()}\n`);
await orm.close();
