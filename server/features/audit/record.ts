import type { EntityManager } from '@mikro-orm/better-sqlite';
import { AuditEvent, type IUser } from '../../db/entities.ts';
import type { Clock } from '../../context.ts';

export type AuditAction =
  | 'auth.sign_in'
  | 'auth.sign_in_failed'
  | 'auth.sign_out'
  | 'auth.reset_requested'
  | 'auth.password_reset'
  | 'user.invited'
  | 'user.invite_accepted'
  | 'user.role_changed'
  | 'user.renamed'
  | 'user.deactivated'
  | 'user.reactivated'
  | 'trace.uploaded'
  | 'trace.shared'
  | 'trace.deleted'
  | 'trace.link_created'
  | 'trace.link_revoked'
  | 'vector.created'
  | 'vector.updated'
  | 'vector.restored'
  | 'vector.imported'
  | 'vector.deleted'
  | 'token.created'
  | 'token.revoked';

/** Queues an audit event in the unit of work; the caller's flush writes it with the change it records. */
export function recordAudit(em: EntityManager, clock: Clock, event: { actor: IUser | null; action: AuditAction; target?: string; details?: Record<string, unknown> }): void {
  em.create(AuditEvent, {
    at: clock.now(),
    actorId: event.actor?.id ?? null,
    actorEmail: event.actor?.email ?? null,
    actorName: event.actor?.name ?? null,
    action: event.action,
    target: event.target ?? null,
    details: event.details ?? null,
  });
}
