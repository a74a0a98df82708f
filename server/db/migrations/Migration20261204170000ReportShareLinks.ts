import { Migration } from '@mikro-orm/migrations';

/** Read-only report links (server/features/traces/share-links.ts). Generated from the entity (print-schema.ts), then reviewed. */
export class Migration20261204170000ReportShareLinks extends Migration {
  override async up(): Promise<void> {
    this.addSql('create table `report_share_link` (`id` integer not null primary key autoincrement, `trace_id` integer not null, `created_by_id` integer not null, `created_by_name` text not null, `created_at` datetime not null, `expires_at` datetime not null, `revoked_at` datetime null);');
    this.addSql('create index `report_share_link_trace_id_index` on `report_share_link` (`trace_id`);');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists `report_share_link`;');
  }
}
