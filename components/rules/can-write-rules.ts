import type { SessionUser } from '../../shared/api-types';

/** Engineers and admins write rules and maintenance windows; everyone else reads them (DESIGN.md §2). */
export function canWriteRules(user: SessionUser | null | undefined): boolean {
  return user?.role === 'admin' || user?.role === 'engineer';
}
