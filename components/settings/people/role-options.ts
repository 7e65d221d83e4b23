import { ROLES, ROLE_LABELS, type Role } from '../../../shared/roles';
import type { SelectOption } from '../../forms/select-field.types';

export const ROLE_OPTIONS: readonly SelectOption<Role>[] = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));
