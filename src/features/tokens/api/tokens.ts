/** The API tokens endpoints (admin): list, create (the token is in the answer once), revoke. */
import { createQueryKeys } from '../../../lib/query-keys.ts';

export type ApiToken = { id: number; project: string; name: string; prefix: string; createdBy: string; createdAt: string; lastUsedAt: string | null; revokedAt: string | null };

export const tokenKeys = createQueryKeys('tokens');
