/**
 * Outgoing mail as a job kind: every message the server sends (invites, password resets, shared
 * diagnoses, new-failure notices) goes through the job queue, so with PostgreSQL any instance or
 * `parley worker` may send it and a message whose sender died is sent by another. The app's
 * `deps.mailer` is the queued mailer below; only the job's handler talks SMTP.
 *
 * `send` still answers the caller: it waits for the job's final event and throws when the mail
 * server refused the message, so a route can say "not sent" (502) as before.
 */
import { randomUUID } from 'node:crypto';
import { jobKind, type JobHandler, type JobQueue } from '../jobs/types.ts';
import type { Mailer, OutgoingMail } from './mailer.ts';

export type MailEvent = { type: 'sent' } | { type: 'failed'; message: string };

/** A mail may carry a sign-in or reset link: the queue forgets it once it is sent. */
export const mailJob = jobKind<OutgoingMail | undefined, MailEvent>('mail', { forgetPayloadWhenDone: true });

/** The handler: one SMTP delivery; a refusal is the job's answer, not a reason to retry at once. */
export function mailHandler(transport: Mailer): JobHandler<OutgoingMail | undefined, MailEvent> {
  return async (mail, job) => {
    // A retry of a job whose message was sent and forgotten just before its worker died.
    if (mail === undefined) return job.publish({ type: 'sent' });
    try {
      await transport.send(mail);
      job.publish({ type: 'sent' });
    } catch (cause) {
      job.publish({ type: 'failed', message: cause instanceof Error ? cause.message : String(cause) });
    }
  };
}

/** A `Mailer` that queues each message as a job and settles when it has been sent or refused. */
export function queuedMailer(jobs: JobQueue): Mailer {
  return {
    async send(mail) {
      const { finished } = await jobs.enqueue(mailJob, randomUUID(), mail);
      const outcome = await finished;
      if (outcome.type === 'failed') throw new Error(`the mail server did not take the message: ${outcome.message}`);
    },
    close() {
      // The transport belongs to the process; the queue closes with it.
    },
  };
}
