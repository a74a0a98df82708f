import { Migration } from '@mikro-orm/migrations';

/**
 * ../migrations/Migration20261204223000LibraryVersion for PostgreSQL: the library's version number,
 * raised once per statement that changes `team_vector`. No index on the tags column here: a
 * B-tree entry must stay under about 2.7 kB and a vector may carry more tags than that; the tag
 * counts are computed once per version anyway.
 */
export class Migration20261204223000LibraryVersion extends Migration {
  override async up(): Promise<void> {
    this.addSql('create table "library_version" ("id" integer not null primary key, "version" bigint not null);');
    this.addSql('insert into "library_version" ("id", "version") values (1, 0);');
    this.addSql('create function "library_version_bump"() returns trigger language plpgsql as $$ begin update "library_version" set "version" = "version" + 1 where "id" = 1; return null; end $$;');
    this.addSql('create trigger "library_version_bump" after insert or update or delete or truncate on "team_vector" for each statement execute function "library_version_bump"();');
  }

  override async down(): Promise<void> {
    this.addSql('drop trigger if exists "library_version_bump" on "team_vector";');
    this.addSql('drop function if exists "library_version_bump"();');
    this.addSql('drop table if exists "library_version";');
  }
}
