// POST /v1/metrics: OTLP/HTTP metrics intake (OpenTelemetry Protocol specification, "OTLP/HTTP").
// Token-only (Bearer with scope `ingest`), so it sits outside /api: no session, no CSRF. The
// answer is written in the request's encoding: JSON for application/json, protobuf for
// application/x-protobuf. 200 only after the points are committed; 503 + Retry-After when the
// database cannot be reached and 429 + Retry-After when too many requests are in progress, both
// of which OTLP clients retry.
import { isAscii } from 'node:buffer';
import { Router, type ErrorRequestHandler, type Request, type RequestHandler } from 'express';
import type { Knex } from 'knex';
import type { Principal } from '../auth/principal';
import { AppError, ForbiddenError, UnauthorizedError } from '../errors';
import { asUnavailable } from '../signals/db-unavailable';
import { ingestService } from '../signals/ingest-service';
import { tokensService } from '../services/tokens';
import { inFlightLimit } from './load-shedding';
import { describeRejections, MalformedOtlpError, normalizeExportRequest } from './otlp-normalize';
import { decodeExportMetricsRequest, encodeExportMetricsResponse, encodeStatus, ProtobufDecodeError } from './otlp-protobuf';
import { readBody } from './read-body';

export interface OtlpIntakeOptions {
  /** Body limit before and after decompression (default 20 MiB). */
  maxBodyBytes?: number;
  /** Requests in progress before 429 (default PARALLAX_INGEST_MAX_IN_FLIGHT or 16). */
  maxInFlight?: number;
  log?: (msg: string, err?: unknown) => void;
}

export const OTLP_MAX_BODY_BYTES = 20 * 1024 * 1024;
const AUTH_CACHE_MS = 5000;

type Encoding = 'json' | 'protobuf';

function encodingOf(req: Request): Encoding | null {
  if (req.is('application/json')) return 'json';
  if (req.is('application/x-protobuf') || req.is('application/protobuf')) return 'protobuf';
  return null;
}

// google.rpc.Code values for the Status body OTLP sends with an error.
function grpcCode(status: number): number {
  if (status === 400 || status === 415) return 3; // INVALID_ARGUMENT
  if (status === 401) return 16; // UNAUTHENTICATED
  if (status === 403) return 7; // PERMISSION_DENIED
  if (status === 413 || status === 429) return 8; // RESOURCE_EXHAUSTED
  if (status === 503) return 14; // UNAVAILABLE
  return 13; // INTERNAL
}

/**
 * The body as text. OTLP/JSON is nearly always plain ASCII, and ASCII read as Latin-1 is the same
 * text: decoding it as UTF-8 took 10–15 ms of a 2.5 MB export in bench/ingest.ts, the check and
 * the Latin-1 copy about 2.
 */
function bodyText(raw: Buffer): string {
  return isAscii(raw) ? raw.toString('latin1') : raw.toString('utf8');
}

export function otlpMetricsRoutes(db: Knex, opts: OtlpIntakeOptions = {}): Router {
  const r = Router();
  const tokens = tokensService(db);
  const ingest = ingestService(db);
  const limit = opts.maxBodyBytes ?? OTLP_MAX_BODY_BYTES;
  const maxInFlight = opts.maxInFlight ?? Number(process.env.PARALLAX_INGEST_MAX_IN_FLIGHT ?? 16);
  const log = opts.log ?? ((msg, err) => console.error(`[intake] ${msg}`, err ?? ''));

  // An exporter sends every few seconds with the same token; looking it up (and recording its use)
  // each time would add a write to every export. A known token is trusted for AUTH_CACHE_MS, so
  // a revoked ingest token keeps working that much longer on this endpoint only.
  const known = new Map<string, { p: Principal; until: number }>();
  const authenticate: RequestHandler = async (req, res, next) => {
    const m = /^Bearer\s+(\S+)$/i.exec(req.get('authorization') ?? '');
    if (!m) return next(new UnauthorizedError('Send an API token with scope ingest: Authorization: Bearer <token>'));
    const secret = m[1]!;
    let p: Principal | null;
    const hit = known.get(secret);
    if (hit && hit.until > Date.now()) p = hit.p;
    else {
      try {
        p = await tokens.authenticate(secret);
      } catch (e) {
        return next(asUnavailable(e));
      }
      if (known.size > 1000) known.clear();
      if (p) known.set(secret, { p, until: Date.now() + AUTH_CACHE_MS });
      else known.delete(secret);
    }
    if (!p || p.type !== 'token') return next(new UnauthorizedError('Unknown, malformed or revoked API token'));
    if (!p.scopes.includes('ingest')) return next(new ForbiddenError('This needs a token with scope ingest'));
    res.locals.principal = p;
    next();
  };

  r.post('/', inFlightLimit(maxInFlight), authenticate, async (req, res) => {
    const encoding = encodingOf(req);
    if (!encoding) throw new AppError(415, 'validation', 'Content-Type must be application/json or application/x-protobuf');
    const raw = await readBody(req, limit);
    let body: unknown;
    try {
      body = encoding === 'json' ? JSON.parse(bodyText(raw)) : decodeExportMetricsRequest(raw);
    } catch (e) {
      if (e instanceof SyntaxError) throw new AppError(400, 'validation', `The body is not valid JSON: ${e.message}`);
      if (e instanceof ProtobufDecodeError) throw new AppError(400, 'validation', e.message);
      throw e;
    }
    let normalized;
    try {
      normalized = normalizeExportRequest(body);
    } catch (e) {
      if (e instanceof MalformedOtlpError) throw new AppError(400, 'validation', e.message, e.path);
      throw e;
    }
    const outcome = normalized.points.length ? await ingest.write(normalized.points) : { accepted: 0, duplicates: 0, rejected: [] };
    const { count, message } = describeRejections(normalized.rejected, outcome.rejected);
    const partial = count > 0 ? { rejectedDataPoints: count, errorMessage: message } : undefined;
    if (encoding === 'protobuf') {
      res.status(200).type('application/x-protobuf').send(Buffer.from(encodeExportMetricsResponse(partial)));
    } else {
      // proto3 JSON writes int64 as a decimal string.
      res.status(200).json(partial ? { partialSuccess: { rejectedDataPoints: String(count), errorMessage: message } } : {});
    }
  });

  const errors: ErrorRequestHandler = (err, req, res, _next) => {
    let e: AppError;
    const mapped = asUnavailable(err);
    if (mapped instanceof AppError) e = mapped;
    else {
      log(`unhandled error on ${req.method} ${req.originalUrl}`, err);
      e = new AppError(500, 'internal', 'Something went wrong on our side; it has been logged');
    }
    // Anything the client is still sending is read into nothing, so it gets the answer, not a reset.
    if (!req.complete) req.resume();
    if (res.headersSent) return;
    for (const [k, v] of Object.entries(e.headers)) res.setHeader(k, v);
    const code = grpcCode(e.status);
    if (encodingOf(req) === 'protobuf') {
      res.status(e.status).type('application/x-protobuf').send(Buffer.from(encodeStatus(code, e.message)));
    } else {
      // The OTLP Status fields, plus Parallax's usual error object for its own clients.
      res.status(e.status).json({ code, message: e.message, error: { code: e.code, message: e.message, ...(e.field ? { field: e.field } : {}) } });
    }
  };
  r.use(errors);
  return r;
}
