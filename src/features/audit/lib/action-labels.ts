/**
 * Plain-English labels for the audit log's action codes (server/features/audit/record.ts's
 * `AuditAction`): what the person in the Who column did. The code stays visible beside the label,
 * so a label never hides what was recorded.
 */
const actionLabels: Record<string, string> = {
  'auth.sign_in': 'Signed in',
  'auth.sign_in_failed': 'Sign-in refused',
  'auth.sign_out': 'Signed out',
  'auth.reset_requested': 'Asked for a password reset',
  'auth.password_reset': 'Reset their password',
  'user.invited': 'Invited a user',
  'user.invite_accepted': 'Accepted an invitation',
  'user.role_changed': 'Changed a role',
  'user.renamed': 'Renamed a user',
  'user.deactivated': 'Deactivated a user',
  'user.reactivated': 'Reactivated a user',
  'trace.uploaded': 'Uploaded a trace',
  'trace.shared': 'Shared a trace by e-mail',
  'trace.deleted': 'Deleted a trace',
  'trace.link_created': 'Made a read-only report link',
  'trace.link_revoked': 'Withdrew a report link',
  'vector.created': 'Created a vector',
  'vector.updated': 'Edited a vector',
  'vector.restored': 'Restored a vector revision',
  'vector.imported': 'Imported vectors',
  'vector.deleted': 'Deleted a vector',
  'token.created': 'Created an API token',
  'token.revoked': 'Revoked an API token',
};

export const labelledActions: readonly string[] = Object.keys(actionLabels);

/** The label of an action code; a code this client does not know yet reads as its words ("run.started" → "Run started"). */
export function actionLabel(action: string): string {
  const known = actionLabels[action];
  if (known) return known;
  const words = action.replace(/[._]+/g, ' ').trim();
  return words === '' ? action : words[0]!.toUpperCase() + words.slice(1);
}
