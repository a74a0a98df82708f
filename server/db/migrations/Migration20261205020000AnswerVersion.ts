import { Migration } from '@mikro-orm/migrations';

const tables = ['run_result', 'device_under_test', 'trace'] as const;
const events = ['insert', 'update', 'delete'] as const;

/**
 * The library's version number (Migration20261204223000LibraryVersion) is raised by changes of every
 * table a kept answer is read from, not only `team_vector`: a list row shows its vector's newest
 * result and device name, and the trace list and summary show trace rows and device names
 * (server/http/kept-answers.ts). One number for all of them: a writer touching two of these tables
 * takes the one row lock, never two in different orders.
 */
export class Migration20261205020000AnswerVersion extends Migration {
  override async up(): Promise<void> {
    for (const table of tables) {
      for (const event of events) {
        this.addSql(`create trigger \`answer_version_${table}_${event}\` after ${event} on \`${table}\` begin update \`library_version\` set \`version\` = \`version\` + 1 where \`id\` = 1; end;`);
      }
    }
  }

  override async down(): Promise<void> {
    for (const table of tables) for (const event of events) this.addSql(`drop trigger if exists \`answer_version_${table}_${event}\`;`);
  }
}
