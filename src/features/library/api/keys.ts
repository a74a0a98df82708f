export { vectorKeys } from '../../../lib/api/create-vector.ts';
