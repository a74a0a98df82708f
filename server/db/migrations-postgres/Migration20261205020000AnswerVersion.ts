import { Migration } from '@mikro-orm/migrations';

const tables = ['run_result', 'device_under_test', 'trace'] as const;

/**
 * ../migrations/Migration20261205020000AnswerVersion for PostgreSQL: the library's version number is
 * raised once per statement that changes any table a kept answer is read from.
 */
export class Migration20261205020000AnswerVersion extends Migration {
  override async up(): Promise<void> {
    for (const table of tables) {
      this.addSql(`create trigger "answer_version_bump" after insert or update or delete or truncate on "${table}" for each statement execute function "library_version_bump"();`);
    }
  }

  override async down(): Promise<void> {
    for (const table of tables) this.addSql(`drop trigger if exists "answer_version_bump" on "${table}";`);
  }
}
