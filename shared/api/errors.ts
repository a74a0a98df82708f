/**
 * The error body of every failed API call and the codes it carries. Codes read `noun.kebab-case`
 * (`trace.not-found`); the client branches on them, never on messages.
 */
export const apiErrorCodes = [
  // Any route
  'input.invalid',
  'input.malformed-json',
  'request.invalid',
  'request.too-large',
  'request.unsupported-encoding',
  'request.rate-limited',
  'request.cross-site',
  'route.not-found',
  'resource.not-found',
  'resource.conflict',
  'upload.invalid',
  'upstream.failed',
  'server.internal',
  // Who is calling
  'auth.required',
  'auth.invalid-credentials',
  'account.deactivated',
  'invite.used',
  'role.forbidden',
  'token.invalid',
  'token.not-accepted',
  'token.not-found',
  'token.out-of-scope',
  'user.exists',
  'user.self-change',
  'mail.not-sent',
  // Resources
  'trace.not-found',
  'share-link.invalid',
  'share-link.not-found',
  'share-link.not-yours',
  'import-mapping.too-many',
  'import-mapping.name-taken',
  'import-mapping.not-found',
  'import-mapping.not-yours',
  'trace.not-a-trace',
  'trace.no-file',
  'trace.file-missing',
  'trace.too-many-records',
  'trace.unreadable',
  'trace.not-analysed',
  'trace.analysis-missing',
  'trace.busy',
  /** The trace store (folder or bucket) did not take an upload; nothing of it was kept. */
  'trace.not-stored',
  'analysis.failed',
  'vector.not-found',
  'vector.no-revision',
  'vector.no-file',
  'vector.import-invalid',
  'vector.bad-zip',
  'vector.import-failed',
  'vector.import-unknown',
  'vector.stale',
  'vector.exists',
  'run.not-found',
  'run.bad-report',
  'run.nothing',
  'sweep.too-many-runs',
  'sweep.unplannable',
  'sandbox.unavailable',
] as const;

export type ApiErrorCode = (typeof apiErrorCodes)[number];

/** Codes the client makes up itself when no answer arrives (`0`) or the answer carries no code. */
export type ClientErrorCode = 'network.unreachable' | 'http.failed';

export interface ApiErrorBody {
  error: { code: ApiErrorCode; message: string; details?: unknown };
}

/** One field's problem in a 400 `input.invalid`'s details. */
export interface FieldIssue {
  path: string;
  message: string;
}
