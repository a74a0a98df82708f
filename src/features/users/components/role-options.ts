import { roleLabels, roles } from '../../../lib/roles.ts';

export const roleOptions = roles.map((role) => ({ value: role, label: roleLabels[role] }));
