import { Migration } from '@mikro-orm/migrations';

/** The team library: vectors and their revisions, test runs and results, CI API tokens. Generated from the entities (print-schema.ts), then reviewed. */
export class Migration20261201200000Library extends Migration {
  override async up(): Promise<void> {
    this.addSql('create table `api_token` (`id` integer not null primary key autoincrement, `project` text not null, `name` text not null, `token_hash` text not null, `token_prefix` text not null, `created_by_id` integer not null, `created_by_name` text not null, `created_at` datetime not null, `last_used_at` datetime null, `revoked_at` datetime null);');
    this.addSql('create index `api_token_project_index` on `api_token` (`project`);');
    this.addSql('create unique index `api_token_token_hash_unique` on `api_token` (`token_hash`);');
    this.addSql('create table `run_result` (`id` integer not null primary key autoincrement, `run_id` integer not null, `vector_id` text not null, `title` text null, `kind` text null, `vector_revision` integer null, `ok` integer not null, `message` text null, `duration_ms` real not null, `new_failure` integer not null, `detail` json null, `created_at` datetime not null);');
    this.addSql('create index `run_result_run_id_index` on `run_result` (`run_id`);');
    this.addSql('create index `run_result_vector_id_index` on `run_result` (`vector_id`);');
    this.addSql('create table `team_vector` (`id` integer not null primary key autoincrement, `vector_id` text not null, `title` text not null, `kind` text not null, `tags` text not null, `text` text not null, `revision` integer not null, `device_id` integer null, `author_id` integer not null, `author_name` text not null, `updated_by_id` integer not null, `updated_by_name` text not null, `created_at` datetime not null, `updated_at` datetime not null);');
    this.addSql('create unique index `team_vector_vector_id_unique` on `team_vector` (`vector_id`);');
    this.addSql('create index `team_vector_kind_index` on `team_vector` (`kind`);');
    this.addSql('create index `team_vector_device_id_index` on `team_vector` (`device_id`);');
    this.addSql('create index `team_vector_author_id_index` on `team_vector` (`author_id`);');
    this.addSql('create table `test_run` (`id` integer not null primary key autoincrement, `project` text not null, `build` text null, `source` text not null, `status` text not null, `selection` text not null, `total` integer not null, `done` integer not null, `passed` integer not null, `failed` integer not null, `new_failures` integer not null, `started_by_id` integer null, `started_by_name` text not null, `token_id` integer null, `error_message` text null, `created_at` datetime not null, `finished_at` datetime null);');
    this.addSql('create index `test_run_project_index` on `test_run` (`project`);');
    this.addSql('create table `vector_revision` (`id` integer not null primary key autoincrement, `vector_row_id` integer not null, `revision` integer not null, `text` text not null, `message` text not null, `author_id` integer not null, `author_name` text not null, `created_at` datetime not null);');
    this.addSql('create index `vector_revision_vector_row_id_index` on `vector_revision` (`vector_row_id`);');
    this.addSql('create unique index `vector_revision_vector_row_id_revision_unique` on `vector_revision` (`vector_row_id`, `revision`);');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists `vector_revision`;');
    this.addSql('drop table if exists `test_run`;');
    this.addSql('drop table if exists `team_vector`;');
    this.addSql('drop table if exists `run_result`;');
    this.addSql('drop table if exists `api_token`;');
  }
}
