import { Migration } from '@mikro-orm/migrations';

/** Uploaded traces and their comments. Generated from the entities (print-schema.ts), then reviewed. */
export class Migration20261201183000Traces extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      'create table `trace` (`id` integer not null primary key autoincrement, `title` text not null, `file_name` text not null, `sha256` text not null, `size_bytes` integer not null, `format` text not null, `uploader_id` integer not null, `uploader_name` text not null, `device_id` integer null, `customer_ref` text not null, `notes` text not null, `status` text not null, `error_code` text null, `error_message` text null, `summary` text null, `messages` integer not null, `error_count` integer not null, `warning_count` integer not null, `info_count` integer not null, `rules` text not null, `analysis` json null, `created_at` datetime not null, `analysed_at` datetime null);',
    );
    this.addSql('create unique index `trace_sha256_unique` on `trace` (`sha256`);');
    this.addSql('create index `trace_uploader_id_index` on `trace` (`uploader_id`);');
    this.addSql('create index `trace_device_id_index` on `trace` (`device_id`);');
    this.addSql(
      'create table `trace_comment` (`id` integer not null primary key autoincrement, `trace_id` integer not null, `author_id` integer not null, `author_name` text not null, `author_role` text not null, `body` text not null, `created_at` datetime not null);',
    );
    this.addSql('create index `trace_comment_trace_id_index` on `trace_comment` (`trace_id`);');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists `trace_comment`;');
    this.addSql('drop table if exists `trace`;');
  }
}
