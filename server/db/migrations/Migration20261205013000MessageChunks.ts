import { Migration } from '@mikro-orm/migrations';

/**
 * Every message of a trace is stored (before, only the first 20,000 of the timeline), compressed,
 * with the facts the message list reads per chunk. Analysed traces go back to `queued`, so start-up
 * re-analyses them from their stored files into the new form.
 */
export class Migration20261205013000MessageChunks extends Migration {
  override async up(): Promise<void> {
    this.addSql('alter table `trace_chunk` add column `folded_rows` integer not null default 0;');
    this.addSql('alter table `trace_chunk` add column `caps_index` integer null;');
    this.addSql("update `trace` set `status` = 'queued' where `status` = 'done';");
  }

  override async down(): Promise<void> {
    this.addSql('alter table `trace_chunk` drop column `folded_rows`;');
    this.addSql('alter table `trace_chunk` drop column `caps_index`;');
    this.addSql("update `trace` set `status` = 'queued' where `status` = 'done';");
  }
}
