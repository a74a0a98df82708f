import { Migration } from '@mikro-orm/migrations';

/**
 * The analysis leaves the trace row: stored compressed beside the file, with the parts the trace page
 * reads in rows of their own. Analysed traces go back to `queued`, so start-up re-analyses them from
 * their stored files into the new form (the analysis is a pure function of the file).
 */
export class Migration20261204190000TraceViews extends Migration {
  override async up(): Promise<void> {
    this.addSql('create table `trace_chunk` (`id` integer not null primary key autoincrement, `trace_id` integer not null, `kind` text not null, `level` integer not null, `seq` integer not null, `first_index` integer not null, `start_us` bigint not null, `end_us` bigint not null, `count` integer not null, `body` text not null);');
    this.addSql('create index `trace_chunk_trace_id_kind_level_start_us_index` on `trace_chunk` (`trace_id`, `kind`, `level`, `start_us`);');
    this.addSql('create table `trace_item` (`id` integer not null primary key autoincrement, `trace_id` integer not null, `kind` text not null, `item_index` integer not null, `t` bigint null, `severity` text null, `rule` text null, `body` text not null);');
    this.addSql('create index `trace_item_trace_id_kind_item_index_index` on `trace_item` (`trace_id`, `kind`, `item_index`);');
    this.addSql('create index `trace_item_trace_id_kind_severity_item_index_index` on `trace_item` (`trace_id`, `kind`, `severity`, `item_index`);');
    this.addSql("update `trace` set `status` = 'queued' where `status` = 'done';");
    this.addSql('alter table `trace` drop column `analysis`;');
    this.addSql('alter table `trace` add column `analysis_bytes` integer null;');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists `trace_item`;');
    this.addSql('drop table if exists `trace_chunk`;');
    this.addSql('alter table `trace` drop column `analysis_bytes`;');
    this.addSql("alter table `trace` add column `analysis` json null;");
    this.addSql("update `trace` set `status` = 'queued' where `status` = 'done';");
  }
}
