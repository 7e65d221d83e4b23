// Who may call the alerting routes (DESIGN.md §2): everyone (and read tokens) reads; engineers
// and admins write rules, windows and channels; only admins read the outgoing mail.
import { allow } from '../auth/access';

export const readers = allow({ roles: 'any', scopes: ['read'] });
export const writers = allow({ roles: ['engineer', 'admin'] });
export const admins = allow({ roles: ['admin'] });
