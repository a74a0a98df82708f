import { ApiError, errorFromBody } from '../../../lib/api-client.ts';
import { MAX_TRACE_BYTES, type TraceDetail } from '../../../../shared/api/index.ts';

const MAX_TRACE_MB = MAX_TRACE_BYTES / 1024 / 1024;

export type UploadInput = { file: File; title?: string; deviceId?: string; customerRef?: string; notes?: string };

function errorOf(status: number, text: string): ApiError {
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    // Not JSON: a proxy's page; the status speaks instead.
  }
  if (status === 413 && !body) return new ApiError(413, 'request.too-large', `The file is larger than the server accepts (${MAX_TRACE_MB} MB).`);
  return errorFromBody(status, body, `The upload failed (${status}).`);
}

/**
 * Sends a trace with XMLHttpRequest, whose upload events give a progress bar that fetch cannot;
 * `?wait=false`, so the answer comes as soon as the file is stored and the analysis is followed
 * over server-sent events.
 */
export function uploadTrace(input: UploadInput, options: { onProgress?(fraction: number): void; signal?: AbortSignal } = {}): Promise<TraceDetail> {
  if (input.file.size > MAX_TRACE_BYTES) {
    const mb = (input.file.size / 1024 / 1024).toFixed(1);
    return Promise.reject(new ApiError(413, 'request.too-large', `The file is ${mb} MB; Parley accepts traces up to ${MAX_TRACE_MB} MB. Cut the capture to the part around the problem.`));
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
    xhr.onerror = () => reject(new ApiError(0, 'network.unreachable', 'The upload did not reach the server. Check your connection and try again.'));
    xhr.onabort = () => reject(new DOMException('Upload cancelled', 'AbortError'));
    options.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}
