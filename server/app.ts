// The Express application, built from its dependencies so tests can drive it without a port.
import fs from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import connectPgSimple from 'connect-pg-simple';
import { csrfSync } from 'csrf-sync';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import type { Knex } from 'knex';
import type pg from 'pg';
import type PgBoss from 'pg-boss';
import { authRoutes, configurePassport } from './routes/auth';
import { journeysRoutes, runsRoutes } from './routes/journeys';
import { probeAdminRoutes } from './routes/probe-admin';
import { alertsRoutes } from './rules/alerts-routes';
import { channelsRoutes } from './rules/channels-routes';
import { maintenanceWindowsRoutes } from './rules/maintenance-routes';
import { outgoingMailRoutes } from './rules/outgoing-mail-routes';
import { rulesRoutes } from './rules/rules-routes';
import { errorHandler, notFoundApi } from './http/error-handler';
import { otlpMetricsRoutes } from './ingest/otlp-routes';
import { servicesRoutes } from './signals/services-routes';
import { signalsRoutes } from './signals/signals-routes';
import { systemRoutes } from './routes/system';
import { tokensRoutes } from './routes/tokens';
import { usersRoutes } from './routes/users';
import { tokensService } from './services/tokens';

export interface AppDeps {
  db: Knex;
  /** A pg pool for the session store (connect-pg-simple speaks to pg directly). */
  sessionPool: pg.Pool;
  sessionSecret: string;
  /** Built web app (expo export output); omitted in API-only tests. */
  webDir?: string;
  now?: () => Date;
  signInLimit?: { windowMs: number; max: number };
  jsonLimit?: string;
  log?: (msg: string, err?: unknown) => void;
  /** Number of proxies in front (for req.ip and secure cookies behind TLS termination). */
  trustProxy?: number | boolean;
  /** AES-256-GCM key for secrets (server/secrets/cipher.ts). */
  secretKey: Buffer;
  /** Queue access (send only) for "try it now". */
  boss?: PgBoss;
}

export function createApp(deps: AppDeps): Express {
  const now = deps.now ?? (() => new Date());
  const log = deps.log ?? ((msg, err) => console.error(`[server] ${msg}`, err ?? ''));
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', deps.trustProxy ?? false);
  app.set('query parser', 'simple');

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // The web build loads CanvasKit (WebAssembly) for charts and inlines style attributes.
          'script-src': ["'self'", "'wasm-unsafe-eval'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
        },
      },
    }),
  );
  app.use(compression());
  // OTLP/HTTP intake: token-only (no session, no CSRF), its own body reader with a 20 MiB limit.
  app.use('/v1/metrics', otlpMetricsRoutes(deps.db, { log }));

  const PgStore = connectPgSimple(session);
  app.use(
    session({
      name: 'parallax.sid',
      store: new PgStore({ pool: deps.sessionPool, tableName: 'sessions', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
      secret: deps.sessionSecret,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: 12 * 60 * 60 * 1000 },
    }),
  );

  const authenticator = configurePassport(deps.db);
  app.use(authenticator.session());

  // Who is calling: a Bearer token (machines) or the signed-in person (cookie session).
  const tokens = tokensService(deps.db);
  app.use(async (req, res, next) => {
    const header = req.get('authorization');
    if (header) {
      const m = /^Bearer\s+(\S+)$/i.exec(header);
      const p = m ? await tokens.authenticate(m[1]!) : null;
      if (!p) return res.status(401).json({ error: { code: 'unauthorized', message: 'Unknown, malformed or revoked API token' } });
      res.locals.principal = p;
    } else if (req.user) {
      res.locals.principal = { type: 'user', ...req.user };
    }
    next();
  });

  // Cookie-authenticated writes need the synchroniser token; token-authenticated calls carry no
  // ambient credentials, so forgery does not apply to them.
  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.get('x-csrf-token'),
  });
  // Anonymous calls outside /auth change nothing (the route guard answers 401), so only sign-in
  // and signed-in people's writes are checked.
  const csrf: express.RequestHandler = (req, res, next) => {
    const p = res.locals.principal;
    if (p?.type === 'token' || (!p && !req.path.startsWith('/auth/'))) return next();
    csrfSynchronisedProtection(req, res, next);
  };

  const api = express.Router();
  api.use(express.json({ limit: deps.jsonLimit ?? '1mb' }));
  api.use(csrf);
  api.use('/auth', authRoutes({ authenticator, generateCsrfToken: generateToken, signInLimit: deps.signInLimit ?? { windowMs: 15 * 60_000, max: 10 } }));
  api.use('/users', usersRoutes(deps.db));
  api.use('/tokens', tokensRoutes(deps.db));
  api.use('/services', servicesRoutes(deps.db));
  api.use('/signals', signalsRoutes(deps.db, now));
  api.use('/journeys', journeysRoutes({ db: deps.db, secretKey: deps.secretKey, boss: deps.boss, now }));
  api.use('/runs', runsRoutes(deps.db));
  api.use('/rules', rulesRoutes(deps.db, now));
  api.use('/alerts', alertsRoutes(deps.db, now));
  api.use('/maintenance-windows', maintenanceWindowsRoutes(deps.db, now));
  api.use('/outgoing-mail', outgoingMailRoutes());
  api.use('/channels', channelsRoutes(deps.db, deps.secretKey));
  api.use('/', probeAdminRoutes(deps.db, deps.secretKey, now));
  api.use('/', systemRoutes(deps.db, now));
  api.use(notFoundApi);
  app.use('/api', api);

  if (deps.webDir && fs.existsSync(path.join(deps.webDir, 'index.html'))) {
    const webDir = deps.webDir;
    // Hashed bundle files never change under their name; index.html always revalidates.
    app.use(
      express.static(webDir, {
        index: false,
        setHeaders: (res, file) => {
          if (/[\\/]_expo[\\/]|[\\/]assets[\\/]/.test(file)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        },
      }),
    );
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(webDir, 'index.html'));
    });
  }

  app.use(errorHandler(log));
  return app;
}
