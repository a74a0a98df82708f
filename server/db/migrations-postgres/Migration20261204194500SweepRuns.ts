import { Migration } from '@mikro-orm/migrations';

/** A run's kind and a sweep's campaign and outcomes, as ../migrations has them for SQLite, in PostgreSQL's dialect. */
export class Migration20261204194500SweepRuns extends Migration {
  override async up(): Promise<void> {
    this.addSql('alter table "test_run" add column "kind" text not null default \'vectors\';');
    this.addSql('alter table "test_run" add column "sweep" jsonb null;');
  }

  override async down(): Promise<void> {
    this.addSql('alter table "test_run" drop column "sweep";');
    this.addSql('alter table "test_run" drop column "kind";');
  }
}
