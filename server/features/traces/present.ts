/** The JSON forms of traces and comments that the API answers with (shapes in shared/api). */
import type { DeviceRef, TraceComment, TraceItem } from '../../../shared/api/index.ts';
import type { ITrace, ITraceComment } from '../../db/trace-entities.ts';

export type { DeviceRef };

export function presentTrace(t: ITrace, devices: ReadonlyMap<number, DeviceRef>): TraceItem {
  return {
    id: t.id,
    title: t.title || t.fileName,
    fileName: t.fileName,
    sizeBytes: t.sizeBytes,
    format: t.format,
    sha256: t.sha256,
    status: t.status,
    uploader: { id: t.uploaderId, name: t.uploaderName },
    device: t.deviceId == null ? null : (devices.get(t.deviceId) ?? { id: t.deviceId, name: `device ${t.deviceId}` }),
    customerRef: t.customerRef,
    notes: t.notes,
    summary: t.summary ?? null,
    messages: t.messages,
    counts: { error: t.errorCount, warning: t.warningCount, info: t.infoCount },
    rules: t.rules.trim() === '' ? [] : t.rules.trim().split(' '),
    error: t.errorCode == null ? null : { code: t.errorCode, message: t.errorMessage ?? '' },
    createdAt: t.createdAt.toISOString(),
    analysedAt: t.analysedAt?.toISOString() ?? null,
  };
}

export type PresentedTrace = TraceItem;

export function presentComment(c: ITraceComment): TraceComment {
  return {
    id: c.id,
    author: { id: c.authorId, name: c.authorName, role: c.authorRole },
    body: c.body,
    createdAt: c.createdAt.toISOString(),
  };
}
