import { Migration } from '@mikro-orm/migrations';

/** Users, tokens, outbox, audit and devices under test. Generated from the entities, then reviewed. */
export class Migration20250601000000Initial extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      'create table `organisation` (`id` integer not null primary key autoincrement, `name` text not null, `created_at` datetime not null);',
    );
    this.addSql(
      'create table `user` (`id` integer not null primary key autoincrement, `email` text not null, `name` text not null, `role` text not null, `password_hash` text null, `active` integer not null, `invite_pending` integer not null, `session_version` integer not null, `created_at` datetime not null, `last_sign_in_at` datetime null);',
    );
    this.addSql('create unique index `user_email_unique` on `user` (`email`);');
    this.addSql(
      "create table `user_token` (`id` integer not null primary key autoincrement, `user_id` integer not null, `kind` text check (`kind` in ('invite', 'reset')) not null, `token_hash` text not null, `created_at` datetime not null, `expires_at` datetime not null, `used_at` datetime null);",
    );
    this.addSql('create index `user_token_user_id_index` on `user_token` (`user_id`);');
    this.addSql('create unique index `user_token_token_hash_unique` on `user_token` (`token_hash`);');
    this.addSql(
      'create table `outbox_message` (`id` integer not null primary key autoincrement, `to` text not null, `from` text not null, `subject` text not null, `text` text not null, `html` text not null, `sent_at` datetime not null);',
    );
    this.addSql(
      'create table `audit_event` (`id` integer not null primary key autoincrement, `at` datetime not null, `actor_id` integer null, `actor_email` text null, `actor_name` text null, `action` text not null, `target` text null, `details` json null);',
    );
    this.addSql('create index `audit_event_action_index` on `audit_event` (`action`);');
    this.addSql(
      "create table `device_under_test` (`id` integer not null primary key autoincrement, `name` text not null, `maker` text not null, `model` text not null, `role` text check (`role` in ('source', 'sink')) not null, `rating_label` text not null, `pdp_w` integer not null, `pdos` json not null, `notes` text not null, `created_at` datetime not null, `updated_at` datetime not null);",
    );
  }

  override async down(): Promise<void> {
    for (const table of ['device_under_test', 'audit_event', 'outbox_message', 'user_token', 'user', 'organisation']) {
      this.addSql(`drop table if exists \`${table}\`;`);
    }
  }
}
