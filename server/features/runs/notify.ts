/**
 * New failures: the failing vectors of a run that the project's previous finished run did not
 * have failing. Their authors get one e-mail each, listing their vectors, with a link to the run.
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { User } from '../../db/entities.ts';
import { RunResult, TeamVector, TestRun, type ITestRun } from '../../db/library-entities.ts';
import type { AppDeps } from '../../context.ts';
import type { OutgoingMail } from '../../mail/mailer.ts';

/** Marks the run's new failures and returns them (vector id → message). */
export async function markNewFailures(em: EntityManager, run: ITestRun): Promise<Map<string, string>> {
  const failing = await em.find(RunResult, { runId: run.id, ok: false }, { fields: ['id', 'vectorId', 'message'] });
  if (failing.length === 0) return new Map();
  const previous = await em.findOne(TestRun, { project: run.project, id: { $lt: run.id }, status: 'done' }, { orderBy: { id: 'desc' } });
  const before = new Set(previous ? (await em.find(RunResult, { runId: previous.id, ok: false }, { fields: ['vectorId'] })).map((r) => r.vectorId) : []);
  const fresh = failing.filter((r) => !before.has(r.vectorId));
  if (fresh.length > 0) await em.nativeUpdate(RunResult, { id: { $in: fresh.map((r) => r.id) } }, { newFailure: true });
  return new Map(fresh.map((r) => [r.vectorId, r.message ?? 'failed']));
}

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export function newFailureMail(options: { to: string; name: string; run: ITestRun; failures: [string, string][]; link: string }): OutgoingMail {
  const { run, failures } = options;
  const where = `${run.project}${run.build ? ` build ${run.build}` : ''}`;
  const count = failures.length === 1 ? 'A vector you wrote now fails' : `${failures.length} vectors you wrote now fail`;
  const intro = [
    `Hello ${options.name},`,
    `${count} in run #${run.id} of ${where} (${run.source === 'ci' ? 'posted by CI' : `started by ${run.startedByName}`}). The previous run of this project did not fail them.`,
  ];
  const list = failures.map(([id, message]) => `- ${id}: ${message.split('\n')[0]}`);
  return {
    to: options.to,
    subject: `Parley: ${failures.length === 1 ? `${failures[0]![0]} fails` : `${failures.length} of your vectors fail`} in ${where}`,
    text: `${intro.join('\n\n')}\n\n${list.join('\n')}\n\n${options.link}\n\n— Parley\n`,
    html: [
      '<!doctype html><html><body style="font-family: sans-serif; line-height: 1.5; color: #1f2933">',
      ...intro.map((p) => `<p>${escapeHtml(p)}</p>`),
      `<ul>${failures.map(([id, message]) => `<li><code>${escapeHtml(id)}</code>: ${escapeHtml(message.split('\n')[0] ?? '')}</li>`).join('')}</ul>`,
      `<p><a href="${escapeHtml(options.link)}">Open the run</a></p>`,
      '<p>— Parley</p>',
      '</body></html>',
    ].join('\n'),
  };
}

/** One mail per author of a newly failing vector; mail trouble is logged, never fatal to the run. */
export async function mailAuthors(em: EntityManager, deps: Pick<AppDeps, 'mailer' | 'publicUrl' | 'logger'>, run: ITestRun, fresh: Map<string, string>): Promise<number> {
  if (fresh.size === 0) return 0;
  const vectors = await em.find(TeamVector, { vectorId: { $in: [...fresh.keys()] } }, { fields: ['vectorId', 'authorId'] });
  const byAuthor = new Map<number, [string, string][]>();
  for (const v of vectors) byAuthor.set(v.authorId, [...(byAuthor.get(v.authorId) ?? []), [v.vectorId, fresh.get(v.vectorId) ?? 'failed']]);
  const authors = await em.find(User, { id: { $in: [...byAuthor.keys()] }, active: true });
  let sent = 0;
  for (const author of authors) {
    const failures = (byAuthor.get(author.id) ?? []).sort((a, b) => (a[0] < b[0] ? -1 : 1));
    try {
      await deps.mailer.send(newFailureMail({ to: author.email, name: author.name, run, failures, link: `${deps.publicUrl}/runs/${run.id}` }));
      sent += 1;
    } catch (error) {
      deps.logger.warn({ err: error, runId: run.id }, 'new-failure mail not sent');
    }
  }
  return sent;
}
