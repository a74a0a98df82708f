import { Migration } from '@mikro-orm/migrations';

/** Fault sweeps run on the server beside vector runs: a run's kind and a sweep's campaign and outcomes. Generated from the entity (print-schema.ts), then reviewed. */
export class Migration20261204194500SweepRuns extends Migration {
  override async up(): Promise<void> {
    this.addSql("alter table `test_run` add column `kind` text not null default 'vectors';");
    this.addSql('alter table `test_run` add column `sweep` json null;');
  }

  override async down(): Promise<void> {
    this.addSql('alter table `test_run` drop column `sweep`;');
    this.addSql('alter table `test_run` drop column `kind`;');
  }
}
