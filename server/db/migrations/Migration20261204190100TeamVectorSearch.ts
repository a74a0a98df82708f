import { Migration } from '@mikro-orm/migrations';

/**
 * Library lists in SQL with indexes: a full-text index (SQLite FTS5, external content, kept in step
 * by triggers) over each vector's id, title, tags and file text, and indexes for the sort columns.
 * A PostgreSQL database takes a tsvector column with a GIN index instead (server/features/vectors/query.ts).
 */
export class Migration20261204190100TeamVectorSearch extends Migration {
  override async up(): Promise<void> {
    this.addSql("create virtual table `team_vector_search` using fts5(`vector_id`, `title`, `tags`, `text`, content='team_vector', content_rowid='id', tokenize='unicode61');");
    this.addSql("create trigger `team_vector_search_insert` after insert on `team_vector` begin insert into `team_vector_search`(rowid, `vector_id`, `title`, `tags`, `text`) values (new.`id`, new.`vector_id`, new.`title`, new.`tags`, new.`text`); end;");
    this.addSql("create trigger `team_vector_search_delete` after delete on `team_vector` begin insert into `team_vector_search`(`team_vector_search`, rowid, `vector_id`, `title`, `tags`, `text`) values ('delete', old.`id`, old.`vector_id`, old.`title`, old.`tags`, old.`text`); end;");
    this.addSql("create trigger `team_vector_search_update` after update of `vector_id`, `title`, `tags`, `text` on `team_vector` begin insert into `team_vector_search`(`team_vector_search`, rowid, `vector_id`, `title`, `tags`, `text`) values ('delete', old.`id`, old.`vector_id`, old.`title`, old.`tags`, old.`text`); insert into `team_vector_search`(rowid, `vector_id`, `title`, `tags`, `text`) values (new.`id`, new.`vector_id`, new.`title`, new.`tags`, new.`text`); end;");
    this.addSql("insert into `team_vector_search`(`team_vector_search`) values ('rebuild');");
    this.addSql('create index `team_vector_title_index` on `team_vector` (`title`);');
    this.addSql('create index `team_vector_updated_at_index` on `team_vector` (`updated_at`);');
    this.addSql('create index `team_vector_revision_index` on `team_vector` (`revision`);');
    this.addSql('create index `run_result_vector_id_id_index` on `run_result` (`vector_id`, `id`);');
  }

  override async down(): Promise<void> {
    this.addSql('drop trigger if exists `team_vector_search_update`;');
    this.addSql('drop trigger if exists `team_vector_search_delete`;');
    this.addSql('drop trigger if exists `team_vector_search_insert`;');
    this.addSql('drop table if exists `team_vector_search`;');
    this.addSql('drop index if exists `team_vector_title_index`;');
    this.addSql('drop index if exists `team_vector_updated_at_index`;');
    this.addSql('drop index if exists `team_vector_revision_index`;');
    this.addSql('drop index if exists `run_result_vector_id_id_index`;');
  }
}
