import { Migration } from '@mikro-orm/migrations';

/** Read-only report links and import mappings, as ../migrations has them for SQLite, in PostgreSQL's dialect. */
export class Migration20261204181500ReportLinksAndImportMappings extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      'create table "report_share_link" ("id" serial primary key, "trace_id" int not null, "created_by_id" int not null, "created_by_name" text not null, "created_at" timestamptz not null, "expires_at" timestamptz not null, "revoked_at" timestamptz null);',
    );
    this.addSql('create index "report_share_link_trace_id_index" on "report_share_link" ("trace_id");');
    this.addSql(
      'create table "import_mapping" ("id" serial primary key, "name" text not null, "mapping" jsonb not null, "created_by_id" int not null, "created_by_name" text not null, "created_at" timestamptz not null);',
    );
    this.addSql('alter table "import_mapping" add constraint "import_mapping_name_unique" unique ("name");');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists "report_share_link" cascade;');
    this.addSql('drop table if exists "import_mapping" cascade;');
  }
}
