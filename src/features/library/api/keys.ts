import { createQueryKeys } from '../../../lib/query-keys.ts';

export const vectorKeys = createQueryKeys('vectors');
