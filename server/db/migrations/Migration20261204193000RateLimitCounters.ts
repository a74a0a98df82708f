import { Migration } from '@mikro-orm/migrations';

/** Rate-limit counters shared by every instance (server/db/rate-limit-store.ts). Generated from the entity (print-schema.ts). */
export class Migration20261204193000RateLimitCounters extends Migration {
  override async up(): Promise<void> {
    this.addSql('create table `rate_limit_counter` (`key` text not null, `hits` integer not null, `reset_at_ms` bigint not null, primary key (`key`));');
    this.addSql('create index `rate_limit_counter_reset_at_ms_index` on `rate_limit_counter` (`reset_at_ms`);');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists `rate_limit_counter`;');
  }
}
