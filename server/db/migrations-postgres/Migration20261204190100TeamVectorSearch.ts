import { Migration } from '@mikro-orm/migrations';

/**
 * ../migrations/Migration20261204190100TeamVectorSearch for PostgreSQL: its own full-text search
 * instead of FTS5. A stored generated tsvector over the same columns, split into words at every
 * character that is not a letter or digit as FTS5's unicode61 tokenizer splits them, in the
 * `simple` configuration (lower case, no stemming), with a GIN index; server/features/vectors/query.ts
 * asks it with prefix terms.
 */
export class Migration20261204190100TeamVectorSearch extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `alter table "team_vector" add column "search" tsvector generated always as (to_tsvector('simple', regexp_replace("vector_id" || ' ' || "title" || ' ' || "tags" || ' ' || "text", '[^[:alnum:]]+', ' ', 'g'))) stored;`,
    );
    this.addSql('create index "team_vector_search_index" on "team_vector" using gin ("search");');
    this.addSql('create index "team_vector_title_index" on "team_vector" ("title");');
    this.addSql('create index "team_vector_updated_at_index" on "team_vector" ("updated_at");');
    this.addSql('create index "team_vector_revision_index" on "team_vector" ("revision");');
    this.addSql('create index "run_result_vector_id_id_index" on "run_result" ("vector_id", "id");');
  }

  override async down(): Promise<void> {
    this.addSql('drop index if exists "team_vector_search_index";');
    this.addSql('alter table "team_vector" drop column if exists "search";');
    this.addSql('drop index if exists "team_vector_title_index";');
    this.addSql('drop index if exists "team_vector_updated_at_index";');
    this.addSql('drop index if exists "team_vector_revision_index";');
    this.addSql('drop index if exists "run_result_vector_id_id_index";');
  }
}
