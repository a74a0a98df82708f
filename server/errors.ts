import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { Logger } from 'pino';
import type { ApiErrorBody, ApiErrorCode } from '../shared/api/index.ts';
import { fieldOf, zodMessage } from '../shared/core/zod-message.ts';

/**
 * An error meant for the caller: an HTTP status, a stable machine code and one plain sentence.
 * Build them with the factories below; the one error middleware turns them into JSON.
 */
export class HttpError extends Error {
  /** An own field, so it survives libraries that copy an error's fields into their own wrapper. */
  readonly forCaller = true;

  constructor(
    readonly status: number,
    readonly code: ApiErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export type ErrorBody = ApiErrorBody;

export const badRequest = (message: string, code: ApiErrorCode = 'request.invalid', details?: unknown) => new HttpError(400, code, message, details);
export const unauthorized = (message = 'Sign in to continue', code: ApiErrorCode = 'auth.required') => new HttpError(401, code, message);
export const forbidden = (message = 'Your role does not allow this', code: ApiErrorCode = 'role.forbidden') => new HttpError(403, code, message);
export const notFound = (message = 'Not found', code: ApiErrorCode = 'resource.not-found') => new HttpError(404, code, message);
export const conflict = (message: string, code: ApiErrorCode = 'resource.conflict', details?: unknown) => new HttpError(409, code, message, details);
export const tooLarge = (message = 'The request is too large', code: ApiErrorCode = 'request.too-large') => new HttpError(413, code, message);
export const rateLimited = (message = 'Too many attempts; try again later', code: ApiErrorCode = 'request.rate-limited') => new HttpError(429, code, message);
export const badGateway = (message: string, code: ApiErrorCode = 'upstream.failed') => new HttpError(502, code, message);
export const serviceUnavailable = (message: string, code: ApiErrorCode) => new HttpError(503, code, message);

export function fromZod(error: ZodError, location = 'body'): HttpError {
  const details = error.issues.map((issue) => ({ path: fieldOf(issue.path, { where: location }), message: issue.message }));
  return badRequest(zodMessage(error, { where: location }), 'input.invalid', details);
}

interface StatusLike {
  status?: unknown;
  statusCode?: unknown;
  type?: unknown;
  code?: unknown;
  name?: unknown;
  field?: unknown;
}

/**
 * busboy (multer's parser) rejects a malformed multipart body with a plain `Error` and no status or
 * code; these are all of its messages (busboy 1.x, lib/index.js and lib/types/*.js).
 */
const multipartParseErrors =
  /^(Multipart: Boundary not found|Malformed content type|Missing Content-Type|Unsupported content type: |Malformed part header|Unexpected end of form|Unexpected end of file|Malformed urlencoded form)/;

/** Maps errors thrown by body-parser, multer and friends, which carry a status or a code but no message for people. */
function fromLibrary(err: StatusLike): HttpError | null {
  if (err instanceof Error && err.constructor === Error && multipartParseErrors.test(err.message)) {
    return badRequest('body: the multipart form is malformed or cut off; send it again with its boundary and every part complete', 'upload.invalid');
  }
  if (err.type === 'entity.parse.failed') return badRequest('body: malformed JSON', 'input.malformed-json');
  if (err.type === 'entity.too.large') return tooLarge('body: the request body is larger than the server accepts');
  if (err.type === 'encoding.unsupported' || err.type === 'charset.unsupported') {
    return new HttpError(415, 'request.unsupported-encoding', 'body: unsupported content encoding or charset');
  }
  if (err.name === 'MulterError') {
    const field = typeof err.field === 'string' ? err.field : 'file';
    if (err.code === 'LIMIT_FILE_SIZE') return tooLarge(`${field}: the file is larger than the server accepts`);
    return badRequest(`${field}: the upload was not accepted (${String(err.code)})`, 'upload.invalid');
  }
  const status = typeof err.status === 'number' ? err.status : typeof err.statusCode === 'number' ? err.statusCode : 0;
  if (status === 404) return notFound();
  if (status >= 400 && status < 500) return new HttpError(status, 'request.invalid', 'The request could not be understood');
  return null;
}

/** MikroORM wraps what is thrown inside a query (our `onQuery` guard) in a DriverException that copies its own fields. */
function copiedHttpError(err: object): HttpError | null {
  const copy = err as { forCaller?: unknown; status?: unknown; code?: unknown; message?: unknown; details?: unknown };
  if (copy.forCaller !== true || typeof copy.status !== 'number' || copy.status < 400 || copy.status >= 500) return null;
  if (typeof copy.code !== 'string' || typeof copy.message !== 'string') return null;
  return new HttpError(copy.status, copy.code as ApiErrorCode, copy.message, copy.details);
}

export function toHttpError(err: unknown): HttpError | null {
  if (err instanceof HttpError) return err;
  if (typeof err === 'object' && err !== null) {
    const copied = copiedHttpError(err);
    if (copied) return copied;
  }
  if (err instanceof ZodError) return fromZod(err);
  if (typeof err === 'object' && err !== null) return fromLibrary(err as StatusLike);
  return null;
}

/** The one error middleware: every failure leaves as `{"error": {code, message, details?}}`, never a stack or HTML. */
export function errorMiddleware(logger: Logger): ErrorRequestHandler {
  return (err: unknown, _req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    const known = toHttpError(err);
    const httpError = known ?? new HttpError(500, 'server.internal', 'Something went wrong on the server; the error was logged');
    if (!known) logger.error({ err }, 'unhandled error');
    const body: ErrorBody = { error: { code: httpError.code, message: httpError.message } };
    if (httpError.details !== undefined) body.error.details = httpError.details;
    res.status(httpError.status).json(body);
  };
}
