import type { Orm } from '../db/orm.ts';
import { OutboxMessage, type IOutboxMessage } from '../db/entities.ts';

export interface Mailbox {
  /** Every stored message, newest first. */
  list(): Promise<IOutboxMessage[]>;
  /** The newest message to an address, waiting up to `timeoutMs` for it (mail sent after a response). */
  waitFor(to: string, options?: { timeoutMs?: number; after?: number }): Promise<IOutboxMessage>;
}

/** Reads the outbox that the SMTP fake fills; empty when a real SMTP server is configured. */
export function createMailbox(orm: Orm): Mailbox {
  const list = () => orm.em.fork().find(OutboxMessage, {}, { orderBy: { id: 'desc' } });
  return {
    list,
    async waitFor(to, options = {}) {
      const deadline = Date.now() + (options.timeoutMs ?? 5000);
      const wanted = to.toLowerCase();
      for (;;) {
        const found = (await list()).find((m) => m.to.toLowerCase().includes(wanted) && m.id > (options.after ?? 0));
        if (found) return found;
        if (Date.now() > deadline) throw new Error(`no mail to ${to} arrived within ${options.timeoutMs ?? 5000} ms`);
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
    },
  };
}
