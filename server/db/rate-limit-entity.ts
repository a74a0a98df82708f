import { defineEntity, type InferEntity } from '@mikro-orm/core';

/**
 * One rate-limit counter shared by every server instance (./rate-limit-store.ts): hits in the
 * current window and when that window ends. The key is a SHA-256 of the limit's name and the
 * client's key, so no e-mail or address is stored in the clear.
 */
export const RateLimitCounter = defineEntity({
  name: 'RateLimitCounter',
  properties: (p) => ({
    key: p.string().length(64).primary(),
    hits: p.integer(),
    /** Milliseconds since 1970 when the window ends (a plain number on both dialects). */
    resetAtMs: p.bigint('number').index(),
  }),
});
export type IRateLimitCounter = InferEntity<typeof RateLimitCounter>;
