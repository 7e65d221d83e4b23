import type { SessionUser } from '../../shared/api-types';

/** Engineers and admins upload metric CSV and manage collection targets; everyone reads signals. */
export function canWriteSignals(user: SessionUser | null | undefined): boolean {
  return user?.role === 'admin' || user?.role === 'engineer';
}
