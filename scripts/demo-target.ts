/**
 * Demo target: "Quillmoor Tea Company", an invented loose-leaf tea shop on loopback, for `npm start`
 * and tests to probe. Sign in, search the catalogue, fill a basket, check out. Failures switch on
 * and off through the control endpoint (`POST /control`), on the shop's port and on a separate
 * control port that stays reachable while the shop refuses connections.
 *
 *   tsx scripts/demo-target.ts [port]      (or DEMO_TARGET_PORT; control port DEMO_TARGET_CONTROL_PORT, default port + 1)
 *
 * It counts requests, errors and latencies in memory (`stats()`), shaped like metrics (per-route
 * counters and a latency histogram with fixed bucket bounds) so they can later be exported.
 */
import { randomBytes } from 'node:crypto';
import { type IncomingMessage, type Server, type ServerResponse, createServer } from 'node:http';
import type { AddressInfo } from 'node:net';

export const DEMO_ACCOUNT = { email: 'demo@quillmoor.example', password: 'oolong-at-dawn', name: 'Wren Ashdown' } as const;

export interface CatalogueItem {
  id: string;
  name: string;
  kind: string;
  priceCents: number;
}

export const CATALOGUE: readonly CatalogueItem[] = [
  { id: 'tea-101', name: 'Harbour Mist Oolong', kind: 'oolong', priceCents: 1450 },
  { id: 'tea-102', name: 'Copperleaf Breakfast', kind: 'black', priceCents: 890 },
  { id: 'tea-103', name: 'Fernvale Sencha', kind: 'green', priceCents: 1120 },
  { id: 'tea-104', name: 'Lantern Smoke Lapsang', kind: 'black', priceCents: 1320 },
  { id: 'tea-105', name: 'Moonrise Jasmine Pearls', kind: 'green', priceCents: 1980 },
  { id: 'tea-106', name: 'Tidepool Rooibos', kind: 'herbal', priceCents: 760 },
  { id: 'tea-107', name: 'Quillmoor House Oolong', kind: 'oolong', priceCents: 1690 },
];

export interface FailureSettings {
  /** Share of shop requests answered 503, 0..1. */
  errorRate: number;
  /** Delay added before every shop response. */
  addedLatencyMs: number;
  /** Answer 200 with a broken body (truncated JSON, a placeholder page). */
  wrongBody: boolean;
  /** Stop listening on the shop port: connections are refused. */
  refuseConnections: boolean;
}

export const LATENCY_BOUNDS_MS = [5, 10, 25, 50, 100, 250, 500, 1000, 2500, 5000, 10000] as const;

export interface RouteStats {
  requests: number;
  /** Responses with status 500 or above. */
  errors: number;
  byStatus: Record<string, number>;
  latency: {
    boundsMs: readonly number[];
    /** Per-bucket (not cumulative) counts; one more than boundsMs, the last is above the top bound. */
    bucketCounts: number[];
    sumMs: number;
    count: number;
  };
}

export interface DemoStats {
  startedAt: string;
  requests: number;
  errors: number;
  /** Keyed by "METHOD /route". */
  routes: Record<string, RouteStats>;
}

export interface DemoTarget {
  url: string;
  controlUrl: string;
  port: number;
  /** Changes failure settings (same as POST /control); resolves once listening has changed. */
  control(patch: Partial<FailureSettings>): Promise<FailureSettings>;
  settings(): FailureSettings;
  stats(): DemoStats;
  close(): Promise<void>;
}

export interface DemoTargetOptions {
  port?: number;
  /** Default: port + 1, or any free port when port is 0. */
  controlPort?: number;
  host?: string;
  /** Random source for the error rate (tests pass a fixed one). */
  random?: () => number;
  /** Called after every shop request (the demo's OpenTelemetry instruments listen here). */
  onRequest?: (route: string, status: number, ms: number) => void;
}

class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

const NO_FAILURES: FailureSettings = { errorRate: 0, addedLatencyMs: 0, wrongBody: false, refuseConnections: false };
const MAX_BODY_BYTES = 64 * 1024;

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'content-length': Buffer.byteLength(text) });
  res.end(text);
}

async function readJson(req: IncomingMessage): Promise<Record<string, unknown>> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > MAX_BODY_BYTES) throw new HttpError(413, 'request body too large');
    chunks.push(chunk as Buffer);
  }
  if (size === 0) return {};
  try {
    const value = JSON.parse(Buffer.concat(chunks).toString('utf8'));
    if (value === null || typeof value !== 'object' || Array.isArray(value)) throw new Error('not an object');
    return value;
  } catch {
    throw new HttpError(400, 'body must be a JSON object');
  }
}

function parseSettings(body: Record<string, unknown>): Partial<FailureSettings> {
  const patch: Partial<FailureSettings> = {};
  if ('errorRate' in body) {
    if (typeof body.errorRate !== 'number' || !(body.errorRate >= 0 && body.errorRate <= 1)) throw new HttpError(400, 'errorRate must be a number from 0 to 1');
    patch.errorRate = body.errorRate;
  }
  if ('addedLatencyMs' in body) {
    if (typeof body.addedLatencyMs !== 'number' || !Number.isInteger(body.addedLatencyMs) || body.addedLatencyMs < 0 || body.addedLatencyMs > 60_000) {
      throw new HttpError(400, 'addedLatencyMs must be a whole number from 0 to 60000');
    }
    patch.addedLatencyMs = body.addedLatencyMs;
  }
  for (const key of ['wrongBody', 'refuseConnections'] as const) {
    if (key in body) {
      if (typeof body[key] !== 'boolean') throw new HttpError(400, `${key} must be true or false`);
      patch[key] = body[key] as boolean;
    }
  }
  return patch;
}

const HOME_PAGE = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Quillmoor Tea Company</title></head>
<body><h1>Quillmoor Tea Company</h1><p>Loose-leaf teas, packed by hand since a date we made up.</p></body></html>`;

export async function startDemoTarget(options: DemoTargetOptions = {}): Promise<DemoTarget> {
  const host = options.host ?? '127.0.0.1';
  const random = options.random ?? Math.random;
  let settings: FailureSettings = { ...NO_FAILURES };
  const sessions = new Map<string, { email: string; basket: Map<string, number> }>();
  let orderNumber = 1000;
  const startedAt = new Date().toISOString();
  const routes: Record<string, RouteStats> = {};

  function record(route: string, status: number, ms: number): void {
    const r = (routes[route] ??= {
      requests: 0,
      errors: 0,
      byStatus: {},
      latency: { boundsMs: LATENCY_BOUNDS_MS, bucketCounts: new Array(LATENCY_BOUNDS_MS.length + 1).fill(0), sumMs: 0, count: 0 },
    });
    r.requests++;
    if (status >= 500) r.errors++;
    r.byStatus[status] = (r.byStatus[status] ?? 0) + 1;
    const bucket = LATENCY_BOUNDS_MS.findIndex((bound) => ms <= bound);
    r.latency.bucketCounts[bucket === -1 ? LATENCY_BOUNDS_MS.length : bucket]++;
    r.latency.sumMs += ms;
    r.latency.count++;
    options.onRequest?.(route, status, ms);
  }

  function sessionOf(req: IncomingMessage) {
    const token = /^Bearer\s+(\S+)$/i.exec(req.headers.authorization ?? '')?.[1];
    const session = token ? sessions.get(token) : undefined;
    if (!session) throw new HttpError(401, 'sign in first: send Authorization: Bearer <token>');
    return session;
  }

  function basketView(basket: Map<string, number>) {
    const items = [...basket].map(([id, quantity]) => {
      const item = CATALOGUE.find((c) => c.id === id)!;
      return { id, name: item.name, quantity, priceCents: item.priceCents };
    });
    return { items, totalCents: items.reduce((sum, i) => sum + i.quantity * i.priceCents, 0) };
  }

  type Route = { route: string; handle: (req: IncomingMessage, res: ServerResponse, url: URL) => Promise<void> | void; broken: string };
  const shopRoutes: Record<string, Route> = {
    'GET /': {
      route: '/',
      broken: '<!doctype html><html><body>',
      handle: (_req, res) => {
        res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
        res.end(HOME_PAGE);
      },
    },
    'GET /shop': {
      route: '/shop',
      broken: '',
      handle: (_req, res) => {
        res.writeHead(302, { location: '/' });
        res.end();
      },
    },
    'POST /api/sign-in': {
      route: '/api/sign-in',
      broken: '{"token": ',
      handle: async (req, res) => {
        const body = await readJson(req);
        if (typeof body.email !== 'string' || typeof body.password !== 'string') throw new HttpError(400, 'email and password are required');
        if (body.email !== DEMO_ACCOUNT.email || body.password !== DEMO_ACCOUNT.password) throw new HttpError(401, 'unknown email or wrong password');
        const token = randomBytes(24).toString('base64url');
        sessions.set(token, { email: body.email, basket: new Map() });
        sendJson(res, 200, { token, customer: { name: DEMO_ACCOUNT.name, email: DEMO_ACCOUNT.email } });
      },
    },
    'GET /api/search': {
      route: '/api/search',
      broken: '{"items": [{"id": "tea-1',
      handle: (_req, res, url) => {
        const q = (url.searchParams.get('q') ?? '').trim().toLowerCase();
        const items = CATALOGUE.filter((c) => !q || c.name.toLowerCase().includes(q) || c.kind === q);
        sendJson(res, 200, { query: q, count: items.length, items });
      },
    },
    'GET /api/basket': {
      route: '/api/basket',
      broken: '{"items": null, "totalCents": "',
      handle: (req, res) => sendJson(res, 200, basketView(sessionOf(req).basket)),
    },
    'POST /api/basket': {
      route: '/api/basket',
      broken: '{"items": null, "totalCents": "',
      handle: async (req, res) => {
        const session = sessionOf(req);
        const body = await readJson(req);
        const quantity = body.quantity ?? 1;
        if (typeof quantity !== 'number' || !Number.isInteger(quantity) || quantity < 1 || quantity > 99) throw new HttpError(400, 'quantity must be a whole number from 1 to 99');
        if (!CATALOGUE.some((c) => c.id === body.itemId)) throw new HttpError(404, `no tea with id ${String(body.itemId)}`);
        const id = body.itemId as string;
        session.basket.set(id, (session.basket.get(id) ?? 0) + quantity);
        sendJson(res, 201, basketView(session.basket));
      },
    },
    'POST /api/checkout': {
      route: '/api/checkout',
      broken: '{"orderId": "Q-',
      handle: (req, res) => {
        const session = sessionOf(req);
        const basket = basketView(session.basket);
        if (basket.items.length === 0) throw new HttpError(409, 'the basket is empty');
        session.basket.clear();
        sendJson(res, 201, { orderId: `Q-${++orderNumber}`, status: 'confirmed', totalCents: basket.totalCents, items: basket.items });
      },
    },
  };

  async function control(patch: Partial<FailureSettings>): Promise<FailureSettings> {
    const before = settings.refuseConnections;
    settings = { ...settings, ...patch };
    if (settings.refuseConnections && !before) {
      await new Promise<void>((resolve) => {
        shop.close(() => resolve());
        shop.closeAllConnections();
      });
    } else if (!settings.refuseConnections && before) {
      await listen(shop, port);
    }
    return { ...settings };
  }

  async function handleControl(req: IncomingMessage, res: ServerResponse): Promise<void> {
    if (req.method === 'GET') return sendJson(res, 200, settings);
    if (req.method !== 'POST') throw new HttpError(405, 'use GET or POST');
    sendJson(res, 200, await control(parseSettings(await readJson(req))));
  }

  async function handle(req: IncomingMessage, res: ServerResponse, controlOnly: boolean): Promise<void> {
    const started = performance.now();
    const url = new URL(req.url ?? '/', 'http://demo.invalid');
    const key = `${req.method} ${url.pathname}`;
    let routeName = `${req.method} (unknown)`;
    try {
      // Control calls are the operator's, not the shop's: they stay out of the counts.
      if (url.pathname === '/control') return await handleControl(req, res);
      if (controlOnly) throw new HttpError(404, 'the control port serves /control only');
      res.once('finish', () => record(routeName, res.statusCode, performance.now() - started));
      if (url.pathname === '/healthz') {
        routeName = `${req.method} /healthz`;
        return sendJson(res, 200, { ok: true }); // always healthy: a health check that does not see failures
      }
      const route = shopRoutes[key];
      if (!route) throw new HttpError(404, `no route ${key}`);
      routeName = `${req.method} ${route.route}`;
      if (settings.addedLatencyMs > 0) await new Promise((r) => setTimeout(r, settings.addedLatencyMs));
      if (settings.errorRate > 0 && random() < settings.errorRate) throw new HttpError(503, 'the shop is temporarily unavailable');
      if (settings.wrongBody && route.broken) {
        // The service thinks this went fine: status 200, counted as a success in its own metrics.
        res.writeHead(200, { 'content-type': route.route === '/' ? 'text/html; charset=utf-8' : 'application/json; charset=utf-8' });
        return void res.end(route.broken);
      }
      await route.handle(req, res, url);
    } catch (error) {
      const status = error instanceof HttpError ? error.status : 500;
      if (!res.headersSent) sendJson(res, status, { error: error instanceof HttpError ? error.message : 'internal error' });
      else res.destroy();
    }
  }

  const listen = (server: Server, p: number) =>
    new Promise<number>((resolve, reject) => {
      server.once('error', reject);
      server.listen(p, host, () => {
        server.off('error', reject);
        resolve((server.address() as AddressInfo).port);
      });
    });

  const shop = createServer((req, res) => void handle(req, res, false));
  const controlServer = createServer((req, res) => void handle(req, res, true));
  const port = await listen(shop, options.port ?? 8090);
  const controlPort = await listen(controlServer, options.controlPort ?? (port === 0 || options.port === 0 ? 0 : port + 1));

  return {
    url: `http://${host}:${port}`,
    controlUrl: `http://${host}:${controlPort}/control`,
    port,
    control,
    settings: () => ({ ...settings }),
    stats: () => {
      const copy = structuredClone(routes);
      const all = Object.values(copy);
      return { startedAt, requests: all.reduce((s, r) => s + r.requests, 0), errors: all.reduce((s, r) => s + r.errors, 0), routes: copy };
    },
    close: async () => {
      const closing = [controlServer, ...(settings.refuseConnections ? [] : [shop])].map(
        (server) => new Promise<void>((resolve) => server.close(() => resolve())),
      );
      shop.closeAllConnections();
      controlServer.closeAllConnections();
      await Promise.all(closing);
    },
  };
}

if (process.argv[1] && /demo-target\.[cm]?[jt]s$/.test(process.argv[1])) {
  const port = Number(process.argv[2] ?? process.env.DEMO_TARGET_PORT ?? 8090);
  const controlPort = process.env.DEMO_TARGET_CONTROL_PORT ? Number(process.env.DEMO_TARGET_CONTROL_PORT) : undefined;
  startDemoTarget({ port, controlPort }).then(
    (target) => {
      console.log(`Quillmoor Tea Company (demo target) on ${target.url}; failures switch at ${target.controlUrl}`);
      const stop = () => void target.close().then(() => process.exit(0));
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    },
    (error) => {
      console.error(`demo target could not start: ${error instanceof Error ? error.message : String(error)}`);
      process.exit(1);
    },
  );
}
