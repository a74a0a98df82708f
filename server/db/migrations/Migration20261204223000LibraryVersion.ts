import { Migration } from '@mikro-orm/migrations';

/**
 * A version number of the library, raised by triggers on every insert, update and delete of
 * `team_vector`, so answers computed from the library alone (search matches, totals, tag counts)
 * can be kept in memory while it stands and are known stale at once, on every instance
 * (server/features/vectors/library-cache.ts). An index on the tags column lets the tag counts read
 * the index instead of every row.
 */
export class Migration20261204223000LibraryVersion extends Migration {
  override async up(): Promise<void> {
    this.addSql('create table `library_version` (`id` integer not null primary key, `version` integer not null);');
    this.addSql('insert into `library_version` (`id`, `version`) values (1, 0);');
    for (const event of ['insert', 'update', 'delete']) {
      this.addSql(`create trigger \`library_version_${event}\` after ${event} on \`team_vector\` begin update \`library_version\` set \`version\` = \`version\` + 1 where \`id\` = 1; end;`);
    }
    this.addSql('create index `team_vector_tags_index` on `team_vector` (`tags`);');
  }

  override async down(): Promise<void> {
    for (const event of ['insert', 'update', 'delete']) this.addSql(`drop trigger if exists \`library_version_${event}\`;`);
    this.addSql('drop table if exists `library_version`;');
    this.addSql('drop index if exists `team_vector_tags_index`;');
  }
}
