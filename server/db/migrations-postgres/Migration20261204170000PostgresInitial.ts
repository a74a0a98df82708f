import { Migration } from '@mikro-orm/migrations';

/**
 * The whole schema of ../migrations (initial, traces, library) for PostgreSQL, generated from the
 * entities by MikroORM's PostgreSQL schema generator, then reviewed: strings are `text` as on
 * SQLite (no 255-character limit that SQLite never had), JSON is `jsonb`, times are `timestamptz`.
 */
export class Migration20261204170000PostgresInitial extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      'create table "api_token" ("id" serial primary key, "project" text not null, "name" text not null, "token_hash" text not null, "token_prefix" text not null, "created_by_id" int not null, "created_by_name" text not null, "created_at" timestamptz not null, "last_used_at" timestamptz null, "revoked_at" timestamptz null);',
    );
    this.addSql('create index "api_token_project_index" on "api_token" ("project");');
    this.addSql('alter table "api_token" add constraint "api_token_token_hash_unique" unique ("token_hash");');
    this.addSql(
      'create table "audit_event" ("id" serial primary key, "at" timestamptz not null, "actor_id" int null, "actor_email" text null, "actor_name" text null, "action" text not null, "target" text null, "details" jsonb null);',
    );
    this.addSql('create index "audit_event_action_index" on "audit_event" ("action");');
    this.addSql(
      'create table "device_under_test" ("id" serial primary key, "name" text not null, "maker" text not null, "model" text not null, "role" text check ("role" in (\'source\', \'sink\')) not null, "rating_label" text not null, "pdp_w" int not null, "pdos" jsonb not null, "notes" text not null, "created_at" timestamptz not null, "updated_at" timestamptz not null);',
    );
    this.addSql('create table "organisation" ("id" serial primary key, "name" text not null, "created_at" timestamptz not null);');
    this.addSql(
      'create table "outbox_message" ("id" serial primary key, "to" text not null, "from" text not null, "subject" text not null, "text" text not null, "html" text not null, "sent_at" timestamptz not null);',
    );
    this.addSql(
      'create table "run_result" ("id" serial primary key, "run_id" int not null, "vector_id" text not null, "title" text null, "kind" text null, "vector_revision" int null, "ok" boolean not null, "message" text null, "duration_ms" real not null, "new_failure" boolean not null, "detail" jsonb null, "created_at" timestamptz not null);',
    );
    this.addSql('create index "run_result_run_id_index" on "run_result" ("run_id");');
    this.addSql('create index "run_result_vector_id_index" on "run_result" ("vector_id");');
    this.addSql(
      'create table "team_vector" ("id" serial primary key, "vector_id" text not null, "title" text not null, "kind" text not null, "tags" text not null, "text" text not null, "revision" int not null, "device_id" int null, "author_id" int not null, "author_name" text not null, "updated_by_id" int not null, "updated_by_name" text not null, "created_at" timestamptz not null, "updated_at" timestamptz not null);',
    );
    this.addSql('alter table "team_vector" add constraint "team_vector_vector_id_unique" unique ("vector_id");');
    this.addSql('create index "team_vector_kind_index" on "team_vector" ("kind");');
    this.addSql('create index "team_vector_device_id_index" on "team_vector" ("device_id");');
    this.addSql('create index "team_vector_author_id_index" on "team_vector" ("author_id");');
    this.addSql(
      'create table "test_run" ("id" serial primary key, "project" text not null, "build" text null, "source" text not null, "status" text not null, "selection" text not null, "total" int not null, "done" int not null, "passed" int not null, "failed" int not null, "new_failures" int not null, "started_by_id" int null, "started_by_name" text not null, "token_id" int null, "error_message" text null, "created_at" timestamptz not null, "finished_at" timestamptz null);',
    );
    this.addSql('create index "test_run_project_index" on "test_run" ("project");');
    this.addSql(
      'create table "trace" ("id" serial primary key, "title" text not null, "file_name" text not null, "sha256" text not null, "size_bytes" int not null, "format" text not null, "uploader_id" int not null, "uploader_name" text not null, "device_id" int null, "customer_ref" text not null, "notes" text not null, "status" text not null, "error_code" text null, "error_message" text null, "summary" text null, "messages" int not null, "error_count" int not null, "warning_count" int not null, "info_count" int not null, "rules" text not null, "analysis" jsonb null, "created_at" timestamptz not null, "analysed_at" timestamptz null);',
    );
    this.addSql('alter table "trace" add constraint "trace_sha256_unique" unique ("sha256");');
    this.addSql('create index "trace_uploader_id_index" on "trace" ("uploader_id");');
    this.addSql('create index "trace_device_id_index" on "trace" ("device_id");');
    this.addSql(
      'create table "trace_comment" ("id" serial primary key, "trace_id" int not null, "author_id" int not null, "author_name" text not null, "author_role" text not null, "body" text not null, "created_at" timestamptz not null);',
    );
    this.addSql('create index "trace_comment_trace_id_index" on "trace_comment" ("trace_id");');
    this.addSql(
      'create table "user" ("id" serial primary key, "email" text not null, "name" text not null, "role" text not null, "password_hash" text null, "active" boolean not null, "invite_pending" boolean not null, "session_version" int not null, "created_at" timestamptz not null, "last_sign_in_at" timestamptz null);',
    );
    this.addSql('alter table "user" add constraint "user_email_unique" unique ("email");');
    this.addSql(
      'create table "user_token" ("id" serial primary key, "user_id" int not null, "kind" text check ("kind" in (\'invite\', \'reset\')) not null, "token_hash" text not null, "created_at" timestamptz not null, "expires_at" timestamptz not null, "used_at" timestamptz null);',
    );
    this.addSql('create index "user_token_user_id_index" on "user_token" ("user_id");');
    this.addSql('alter table "user_token" add constraint "user_token_token_hash_unique" unique ("token_hash");');
    this.addSql(
      'create table "vector_revision" ("id" serial primary key, "vector_row_id" int not null, "revision" int not null, "text" text not null, "message" text not null, "author_id" int not null, "author_name" text not null, "created_at" timestamptz not null);',
    );
    this.addSql('create index "vector_revision_vector_row_id_index" on "vector_revision" ("vector_row_id");');
    this.addSql('alter table "vector_revision" add constraint "vector_revision_vector_row_id_revision_unique" unique ("vector_row_id", "revision");');
  }

  override async down(): Promise<void> {
    for (const table of [
      'api_token',
      'audit_event',
      'device_under_test',
      'organisation',
      'outbox_message',
      'run_result',
      'team_vector',
      'test_run',
      'trace',
      'trace_comment',
      'user',
      'user_token',
      'vector_revision',
    ]) {
      this.addSql(`drop table if exists "${table}" cascade;`);
    }
  }
}
