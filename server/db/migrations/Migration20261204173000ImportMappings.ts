import { Migration } from '@mikro-orm/migrations';

/** A team's import mappings for line-oriented logs (server/features/import-mappings). Generated from the entity (print-schema.ts), then reviewed. */
export class Migration20261204173000ImportMappings extends Migration {
  override async up(): Promise<void> {
    this.addSql('create table `import_mapping` (`id` integer not null primary key autoincrement, `name` text not null, `mapping` json not null, `created_by_id` integer not null, `created_by_name` text not null, `created_at` datetime not null);');
    this.addSql('create unique index `import_mapping_name_unique` on `import_mapping` (`name`);');
  }

  override async down(): Promise<void> {
    this.addSql('drop table if exists `import_mapping`;');
  }
}
