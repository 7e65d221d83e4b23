import type { SessionUser } from '../../shared/api-types';
import type { Role } from '../../shared/roles';

export function isAdmin(user: SessionUser | null | undefined): boolean {
  return user?.role === 'admin';
}

/** What each role may do, in the words of DESIGN.md §2, for forms and the account page. */
export const ROLE_ABILITIES: Record<Role, string> = {
  admin: 'Everything, plus people, roles, access tokens, secrets, vantages and mail settings.',
  engineer: 'Creates and edits journeys, services, alert rules, SLOs and maintenance windows.',
  release_manager: 'Records releases and runs release watches; reads everything else.',
  reviewer: 'Reads everything; triages episodes and exports reports.',
};

/** Engineers and admins write journeys (and import HAR files); everyone else reads them. */
export function canWriteJourneys(user: SessionUser | null | undefined): boolean {
  return user?.role === 'admin' || user?.role === 'engineer';
}
