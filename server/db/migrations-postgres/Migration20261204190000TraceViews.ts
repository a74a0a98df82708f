import { Migration } from '@mikro-orm/migrations';

/** ../migrations/Migration20261204190000TraceViews in PostgreSQL's dialect: the analysis leaves the trace row. */
export class Migration20261204190000TraceViews extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      'create table "trace_chunk" ("id" serial primary key, "trace_id" int not null, "kind" text not null, "level" int not null, "seq" int not null, "first_index" int not null, "start_us" bigint not null, "end_us" bigint not null, "count" int not null, "body" text not null);',
    );
    this.addSql('create index "trace_chunk_trace_id_kind_level_start_us_index" on "trace_chunk" ("trace_id", "kind", "level", "start_us");');
    this.addSql(
      'create table "trace_item" ("id" serial primary key, "trace_id" int not null, "kind" text not null, "item_index" int not null, "t" bigint null, "severity" text null, "rule" text null, "body" text not null);',
    );
    this.addSql('create index "trace_item_trace_id_kind_item_index_index" on "trace_item" ("trace_id", "kind", "item_index");');
    this.addSql('create index "trace_item_trace_id_kind_severity_item_index_index" on "trace_item" ("trace_id", "kind", "severity", "item_index");');
    // Start-up re-analyses these from their stored files into the new form (the analysis is a pure function of the file).
    this.addSql(`update "trace" set "status" = 'queued' where "status" = 'done';`);
    this.addSql('alter table "trace" drop column "analysis";');
    this.addSql('alter table "trace" add column "analysis_bytes" int null;');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists "trace_item" cascade;');
    this.addSql('drop table if exists "trace_chunk" cascade;');
    this.addSql('alter table "trace" drop column "analysis_bytes";');
    this.addSql('alter table "trace" add column "analysis" jsonb null;');
    this.addSql(`update "trace" set "status" = 'queued' where "status" = 'done';`);
  }
}
