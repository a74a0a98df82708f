/**
 * The one fetch wrapper for /api. Sends the session cookie, speaks JSON, and turns the server's
 * error body `{ error: { code, message, details? } }` into an ApiError.
 */

import type { ApiErrorCode, ClientErrorCode } from '../../shared/api/index.ts';

export class ApiError extends Error {
  readonly status: number;
  readonly code: ApiErrorCode | ClientErrorCode;
  readonly details: unknown;

  constructor(status: number, code: ApiErrorCode | ClientErrorCode, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type QueryValue = string | number | boolean | undefined | null;

export type RequestOptions = {
  query?: Record<string, QueryValue>;
  body?: unknown;
  signal?: AbortSignal;
  /** Leave a 401 to the caller (sign-in form, the session probe) instead of redirecting. */
  allowUnauthorized?: boolean;
};

let onUnauthorized: (() => void) | null = null;

/** The router registers how to send a signed-out user to the sign-in page (keeping the return path). */
export function setUnauthorizedHandler(handler: (() => void) | null): void {
  onUnauthorized = handler;
}

function buildUrl(path: string, query?: Record<string, QueryValue>): string {
  const url = `/api${path}`;
  if (!query) return url;
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `${url}?${text}` : url;
}

/** The ApiError of a failed answer: the server's `{ error }` body, else a sentence for the status. */
export function errorFromBody(status: number, body: unknown, statusText: string): ApiError {
  if (typeof body === 'object' && body !== null && 'error' in body) {
    const error = (body as { error: unknown }).error;
    if (typeof error === 'object' && error !== null) {
      const { code, message, details } = error as { code?: unknown; message?: unknown; details?: unknown };
      return new ApiError(status, typeof code === 'string' ? (code as ApiErrorCode) : 'http.failed', typeof message === 'string' ? message : statusText || `Request failed (${status})`, details);
    }
  }
  return new ApiError(status, 'http.failed', statusMessage(status, statusText));
}

function statusMessage(status: number, statusText: string): string {
  if (status === 401) return 'Please sign in.';
  if (status === 403) return 'Your role does not allow this.';
  if (status === 404) return 'Not found.';
  if (status === 413) return 'That is too large for the server.';
  if (status === 429) return 'Too many attempts. Wait a moment and try again.';
  if (status >= 500) return 'The server ran into a problem. Try again in a moment.';
  return statusText || `Request failed (${status})`;
}

async function request<T>(method: string, path: string, options: RequestOptions = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  let body: BodyInit | undefined;
  if (options.body instanceof FormData) {
    body = options.body;
  } else if (options.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(options.body);
  }

  let response: Response;
  try {
    response = await fetch(buildUrl(path, options.query), {
      method,
      headers,
      body,
      credentials: 'same-origin',
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network.unreachable', 'Cannot reach the Parley server. Check your connection and try again.');
  }

  if (response.status === 204) return undefined as T;
  const text = await response.text();
  let parsed: unknown;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = undefined;
    }
  }

  if (!response.ok) {
    const error = errorFromBody(response.status, parsed, response.statusText);
    if (response.status === 401 && !options.allowUnauthorized) onUnauthorized?.();
    throw error;
  }
  return parsed as T;
}

export const api = {
  get: <T>(path: string, options?: RequestOptions) => request<T>('GET', path, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('POST', path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PUT', path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PATCH', path, { ...options, body }),
  delete: <T>(path: string, options?: RequestOptions) => request<T>('DELETE', path, options),
};

/** Field errors from a 400 response, when the server sent them as details (`{ field: message }` or a list). */
export function fieldErrorsOf(error: unknown): Record<string, string> {
  if (!isApiError(error) || !error.details) return {};
  const out: Record<string, string> = {};
  const { details } = error;
  if (Array.isArray(details)) {
    for (const item of details) {
      if (typeof item !== 'object' || item === null) continue;
      const { path, field, message } = item as { path?: unknown; field?: unknown; message?: unknown };
      const name = typeof field === 'string' ? field : Array.isArray(path) ? path.join('.') : typeof path === 'string' ? path : '';
      if (name && typeof message === 'string') out[name] = message;
    }
  } else if (typeof details === 'object') {
    for (const [key, value] of Object.entries(details as Record<string, unknown>)) {
      if (typeof value === 'string') out[key] = value;
    }
  }
  return out;
}
