import { createQueryKeys } from '../../../lib/query-keys.ts';

export const runKeys = createQueryKeys('runs');
