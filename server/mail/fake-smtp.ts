import { SMTPServer } from 'smtp-server';
import type { AddressInfo } from 'node:net';
import type { Orm } from '../db/orm.ts';
import { OutboxMessage } from '../db/entities.ts';
import type { Clock } from '../context.ts';
import { parseMessage } from './parse-message.ts';

const maxMessageBytes = 2_000_000;

/**
 * An SMTP server on a random loopback port that stores every message it receives in the outbox
 * table, so invitations and resets work with no mail server. Plain SMTP only (no TLS, no login):
 * it listens on 127.0.0.1 and nothing else can reach it.
 */
export async function startMailFake(options: { orm: Orm; clock: Clock }): Promise<{ url: string; close(): Promise<void> }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: maxMessageBytes,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const parsed = parseMessage(Buffer.concat(chunks).toString('utf8'));
        const recipients = session.envelope.rcptTo.map((rcpt) => rcpt.address).join(', ');
        const em = options.orm.em.fork();
        em.create(OutboxMessage, {
          to: recipients || parsed.to,
          from: parsed.from,
          subject: parsed.subject,
          text: parsed.text,
          html: parsed.html,
          sentAt: options.clock.now(),
        });
        // Stored before the reply, so the sender's sendMail() resolves only once the Outbox has it.
        em.flush().then(
          () => callback(),
          (err: unknown) => callback(err instanceof Error ? err : new Error(String(err))),
        );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return {
    url: `smtp://127.0.0.1:${port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
