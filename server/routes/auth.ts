import { Router, type Request } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import type { Knex } from 'knex';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { SessionInfo } from '../../shared/api-types';
import { signInSchema } from '../../shared/schemas/auth';
import { AppError, UnauthorizedError } from '../errors';
import { validate } from '../http/validate';
import { checkCredentials, sessionUser } from '../services/sign-in';

export interface AuthRouteDeps {
  authenticator: passport.Authenticator;
  generateCsrfToken: (req: Request, overwrite?: boolean) => string;
  signInLimit: { windowMs: number; max: number };
}

export function configurePassport(db: Knex): passport.Authenticator {
  const pp = new passport.Authenticator();
  pp.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      checkCredentials(db, email, password).then((u) => done(null, u ?? false), done);
    }),
  );
  pp.serializeUser((user, done) => done(null, user.id));
  pp.deserializeUser((id: number, done) => {
    sessionUser(db, Number(id)).then((u) => done(null, u ?? false), done);
  });
  return pp;
}

export function authRoutes(deps: AuthRouteDeps): Router {
  const r = Router();

  const limiter = rateLimit({
    windowMs: deps.signInLimit.windowMs,
    limit: deps.signInLimit.max,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    // Per address and email, so one attacker cannot lock everyone out and one account cannot be
    // hammered from one place.
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String((req.body as { email?: unknown })?.email ?? '').toLowerCase()}`,
    handler: (_req, _res, next, options) =>
      next(
        new AppError(429, 'rate_limited', 'Too many sign-in attempts; wait a few minutes and try again', undefined, {
          'Retry-After': String(Math.ceil(options.windowMs / 1000)),
        }),
      ),
  });

  const info = (req: Request, overwrite = false): SessionInfo => ({
    user: req.user ? { id: req.user.id, email: req.user.email, name: req.user.name, role: req.user.role } : null,
    csrfToken: deps.generateCsrfToken(req, overwrite),
  });

  r.get('/session', (req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    res.json(info(req));
  });

  r.get('/me', (req, res, next) => {
    const p = res.locals.principal;
    if (!p) return next(new UnauthorizedError());
    if (p.type === 'token') return res.json({ token: { name: p.name, scopes: p.scopes } });
    res.json({ user: { id: p.id, email: p.email, name: p.name, role: p.role } });
  });

  r.post('/sign-in', limiter, validate('body', signInSchema), (req, res, next) => {
    req.body = res.locals.body;
    deps.authenticator.authenticate('local', (err: unknown, user: Express.User | false) => {
      if (err) return next(err);
      if (!user) return next(new UnauthorizedError('Wrong email or password'));
      // req.logIn regenerates the session id (passport ≥ 0.6), defeating session fixation.
      req.logIn(user, (e) => {
        if (e) return next(e);
        res.json(info(req, true));
      });
    })(req, res, next);
  });

  r.post('/sign-out', (req, res, next) => {
    req.logOut((err) => {
      if (err) return next(err);
      req.session.destroy((e) => {
        if (e) return next(e);
        res.clearCookie('parallax.sid');
        res.status(204).end();
      });
    });
  });

  return r;
}
