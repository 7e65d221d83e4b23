import { isApiError } from '../../hooks/api-client';
import { ROLE_LABELS, type Role } from '../../shared/roles';

/** One sentence for a failed request, in plain words; never the server's internals. */
export function describeError(error: unknown, role?: Role | null): string {
  if (!isApiError(error)) return 'Something went wrong. Try again.';
  switch (error.code) {
    case 'forbidden':
      return role ? `Your role (${ROLE_LABELS[role]}) cannot do this.` : 'Your role cannot do this.';
    case 'unauthorized':
      return 'Your session has ended. Sign in again.';
    case 'network':
      return 'Could not reach the Parallax server. Check that it is running, then try again.';
    case 'rate_limited':
      return 'Too many attempts in a short time. Wait a minute, then try again.';
    case 'csrf':
      return 'This page was open too long to send that safely. Reload the page and try again.';
    case 'unavailable':
      return 'The server cannot reach its database right now. Try again shortly.';
    case 'internal':
      return 'Something went wrong on the server. Try again; if it keeps happening, check the server log.';
    case 'payload_too_large':
      return 'That is more than the server accepts in one request.';
    default:
      return error.message;
  }
}
