import { ApiError } from '../../../lib/api-client.ts';
import type { TraceDetail } from './types.ts';

/** The server's limit (server/features/traces/routes.ts). */
export const MAX_TRACE_BYTES = 50 * 1024 * 1024;

export type UploadInput = { file: File; title?: string; deviceId?: string; customerRef?: string; notes?: string };

function errorOf(status: number, text: string): ApiError {
  try {
    const body = JSON.parse(text) as { error?: { code?: string; message?: string; details?: unknown } };
    if (body.error?.message) return new ApiError(status, body.error.code ?? `http_${status}`, body.error.message, body.error.details);
  } catch {
    // Not JSON: a proxy's page; fall through to the generic sentence.
  }
  if (status === 413) return new ApiError(413, 'too_large', 'The file is larger than the server accepts (50 MB).');
  return new ApiError(status, `http_${status}`, `The upload failed (${status}).`);
}

/**
 * Sends a trace with XMLHttpRequest, whose upload events give a progress bar that fetch cannot;
 * `?wait=false`, so the answer comes as soon as the file is stored and the analysis is followed
 * over server-sent events.
 */
export function uploadTrace(input: UploadInput, options: { onProgress?(fraction: number): void; signal?: AbortSignal } = {}): Promise<TraceDetail> {
  if (input.file.size > MAX_TRACE_BYTES) {
    const mb = (input.file.size / 1024 / 1024).toFixed(1);
    return Promise.reject(new ApiError(413, 'too_large', `The file is ${mb} MB; Parley accepts traces up to 50 MB. Cut the capture to the part around the problem.`));
  }
  const form = new FormData();
  if (input.title) form.set('title', input.title);
  if (input.deviceId) form.set('deviceId', input.deviceId);
  if (input.customerRef) form.set('customerRef', input.customerRef);
  if (input.notes) form.set('notes', input.notes);
  form.set('file', input.file, input.file.name);
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/traces?wait=false');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) options.onProgress?.(event.loaded / event.total);
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        options.onProgress?.(1);
        resolve(JSON.parse(xhr.responseText) as TraceDetail);
      } else reject(errorOf(xhr.status, xhr.responseText));
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload did not reach the server. Check your connection and try again.'));
    xhr.onabort = () => reject(new DOMException('Upload cancelled', 'AbortError'));
    options.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}
