import { Migration } from '@mikro-orm/migrations';

/** ../migrations/Migration20261205013000MessageChunks in PostgreSQL's dialect: every message of a trace is stored. */
export class Migration20261205013000MessageChunks extends Migration {
  override async up(): Promise<void> {
    this.addSql('alter table "trace_chunk" add column "folded_rows" int not null default 0;');
    this.addSql('alter table "trace_chunk" add column "caps_index" int null;');
    this.addSql(`update "trace" set "status" = 'queued' where "status" = 'done';`);
  }

  override async down(): Promise<void> {
    this.addSql('alter table "trace_chunk" drop column "folded_rows";');
    this.addSql('alter table "trace_chunk" drop column "caps_index";');
    this.addSql(`update "trace" set "status" = 'queued' where "status" = 'done';`);
  }
}
