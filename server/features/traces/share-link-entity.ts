import { defineEntity, type InferEntity } from '@mikro-orm/core';

/**
 * A read-only link to one trace's report, for someone without an account: signed with the
 * server's secret, expiring when the sharer chose, revocable (revokedAt) by the sharer or an admin.
 */
export const ReportShareLink = defineEntity({
  name: 'ReportShareLink',
  properties: (p) => ({
    id: p.integer().primary(),
    traceId: p.integer().index(),
    createdById: p.integer(),
    createdByName: p.string(),
    createdAt: p.datetime(),
    expiresAt: p.datetime(),
    revokedAt: p.datetime().nullable(),
  }),
});
export type IReportShareLink = InferEntity<typeof ReportShareLink>;
