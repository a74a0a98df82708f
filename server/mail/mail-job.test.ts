import { describe, expect, it } from 'vitest';
import { createLocalJobQueue } from '../jobs/local-queue.ts';
import { mailHandler, mailJob, queuedMailer } from './mail-job.ts';
import type { Mailer, OutgoingMail } from './mailer.ts';

const mail: OutgoingMail = { to: 'qa@kestrel.example', subject: 'Run 12: 2 new failures', text: 'text', html: '<p>html</p>' };

function transport(fail?: string): Mailer & { sent: OutgoingMail[] } {
  const sent: OutgoingMail[] = [];
  return {
    sent,
    async send(message) {
      if (fail) throw new Error(fail);
      sent.push(message);
    },
    close() {},
  };
}

describe('mail as a job', () => {
  it('a queued message reaches the transport once, and send settles after it', async () => {
    const jobs = createLocalJobQueue();
    const smtp = transport();
    jobs.handle(mailJob, mailHandler(smtp));
    const mailer = queuedMailer(jobs);
    await mailer.send(mail);
    await mailer.send({ ...mail, subject: 'second' });
    expect(smtp.sent.map((m) => m.subject)).toEqual(['Run 12: 2 new failures', 'second']);
    await jobs.close();
  });

  it('a refusal of the mail server reaches the caller as an error', async () => {
    const jobs = createLocalJobQueue();
    jobs.handle(mailJob, mailHandler(transport('550 mailbox unavailable')));
    await expect(queuedMailer(jobs).send(mail)).rejects.toThrow('the mail server did not take the message: 550 mailbox unavailable');
    await jobs.close();
  });
});
