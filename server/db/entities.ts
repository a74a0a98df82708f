import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Trace, TraceChunk, TraceComment, TraceItem } from './trace-entities.ts';
import { libraryEntities } from './library-entities.ts';
import { ReportShareLink } from '../features/traces/share-link-entity.ts';
import { ImportMapping } from '../features/import-mappings/entity.ts';
import { RateLimitCounter } from './rate-limit-entity.ts';

/**
 * Every table of the server. Dates come from the injected clock, so no column has a database default.
 * A new entity goes into `entities` below and gets a migration in ./migrations (see DEVELOPERS.md).
 */

import { deviceRoles, type Role } from '../../shared/api/index.ts';

export { deviceRoles, roles, type Role } from '../../shared/api/index.ts';

export const Organisation = defineEntity({
  name: 'Organisation',
  properties: (p) => ({
    id: p.integer().primary(),
    name: p.string(),
    createdAt: p.datetime(),
  }),
});
export type IOrganisation = InferEntity<typeof Organisation>;

export const User = defineEntity({
  name: 'User',
  properties: (p) => ({
    id: p.integer().primary(),
    email: p.string().unique(),
    name: p.string(),
    /** A plain text column: MikroORM 6's SQLite introspection misreads a five-value check constraint. */
    role: p.string().$type<Role>(),
    /** bcrypt hash; null until an invited user sets a password. */
    passwordHash: p.string().nullable(),
    active: p.boolean(),
    invitePending: p.boolean(),
    /** Bumped on password reset: sessions signed with an older version stop working. */
    sessionVersion: p.integer(),
    createdAt: p.datetime(),
    lastSignInAt: p.datetime().nullable(),
  }),
});
export type IUser = InferEntity<typeof User>;

export const tokenKinds = ['invite', 'reset'] as const;
export type TokenKind = (typeof tokenKinds)[number];

/** Single-use links for invitations and password resets; only the SHA-256 of the token is stored. */
export const UserToken = defineEntity({
  name: 'UserToken',
  properties: (p) => ({
    id: p.integer().primary(),
    userId: p.integer().index(),
    kind: p.enum([...tokenKinds]),
    tokenHash: p.string().unique(),
    createdAt: p.datetime(),
    expiresAt: p.datetime(),
    usedAt: p.datetime().nullable(),
  }),
});
export type IUserToken = InferEntity<typeof UserToken>;

export const OutboxMessage = defineEntity({
  name: 'OutboxMessage',
  properties: (p) => ({
    id: p.integer().primary(),
    to: p.string(),
    from: p.string(),
    subject: p.string(),
    text: p.text(),
    html: p.text(),
    sentAt: p.datetime(),
  }),
});
export type IOutboxMessage = InferEntity<typeof OutboxMessage>;

export const AuditEvent = defineEntity({
  name: 'AuditEvent',
  properties: (p) => ({
    id: p.integer().primary(),
    at: p.datetime(),
    /** Copied at the time of the event so the record survives later renames. */
    actorId: p.integer().nullable(),
    actorEmail: p.string().nullable(),
    actorName: p.string().nullable(),
    action: p.string().index(),
    target: p.string().nullable(),
    details: p.json<Record<string, unknown>>().nullable(),
  }),
});
export type IAuditEvent = InferEntity<typeof AuditEvent>;

export const DeviceUnderTest = defineEntity({
  name: 'DeviceUnderTest',
  properties: (p) => ({
    id: p.integer().primary(),
    name: p.string(),
    maker: p.string(),
    model: p.string(),
    role: p.enum([...deviceRoles]),
    ratingLabel: p.string(),
    pdpW: p.integer(),
    /** PDO words as 8-digit lower-case hex strings, in object-position order. */
    pdos: p.json<string[]>(),
    notes: p.text(),
    createdAt: p.datetime(),
    updatedAt: p.datetime(),
  }),
});
export type IDeviceUnderTest = InferEntity<typeof DeviceUnderTest>;

export const entities = [
  Organisation,
  User,
  UserToken,
  OutboxMessage,
  AuditEvent,
  DeviceUnderTest,
  Trace,
  TraceComment,
  TraceItem,
  TraceChunk,
  ...libraryEntities,
  ReportShareLink,
  ImportMapping,
  RateLimitCounter,
];
