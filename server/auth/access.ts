// One guard for every route: who may call it, by role (people) and by scope (API tokens).
import type { RequestHandler } from 'express';
import { ROLE_LABELS, type Role, type TokenScope } from '../../shared/roles';
import { ForbiddenError, UnauthorizedError } from '../errors';

export interface AccessRule {
  /** Roles of signed-in people allowed; 'any' = every role. */
  roles: Role[] | 'any';
  /** Token scopes allowed; none = tokens may not call this route. */
  scopes?: TokenScope[];
}

export const ANY_ROLE: AccessRule = { roles: 'any' };

export function allow(rule: AccessRule): RequestHandler {
  return (_req, res, next) => {
    const p = res.locals.principal;
    if (!p) return next(new UnauthorizedError());
    if (p.type === 'user') {
      if (rule.roles === 'any' || rule.roles.includes(p.role)) return next();
      return next(new ForbiddenError(`Your role (${ROLE_LABELS[p.role]}) cannot do this`));
    }
    if (rule.scopes?.some((s) => p.scopes.includes(s))) return next();
    const need = rule.scopes?.length ? `a token with scope ${rule.scopes.join(' or ')}` : 'a signed-in person';
    return next(new ForbiddenError(`This needs ${need}`));
  };
}
