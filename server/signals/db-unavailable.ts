// Telling "the database cannot be reached" apart from a bug, so the intake answers 503 with
// Retry-After (OTLP clients retry those) instead of a 500 that they would drop.
import { UnavailableError } from '../errors';

const CONNECTION_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'EPIPE',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENOTFOUND',
  // PostgreSQL: admin_shutdown, crash_shutdown, cannot_connect_now, connection exceptions.
  '57P01',
  '57P02',
  '57P03',
  '08000',
  '08001',
  '08003',
  '08004',
  '08006',
  // too_many_connections
  '53300',
]);

const CONNECTION_MESSAGES = [
  /Connection terminated/i,
  /connection is closed/i,
  /Client has encountered a connection error/i,
  /Knex: Timeout acquiring a connection/i,
  /the database system is (starting up|shutting down|in recovery mode)/i,
  /terminating connection/i,
  /write after end/i,
];

export const DB_RETRY_AFTER_SECONDS = 5;

export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: string; message?: string; name?: string; errors?: unknown[] } | null;
  if (!e) return false;
  if (e.code && CONNECTION_CODES.has(e.code)) return true;
  if (e.name === 'KnexTimeoutError') return true;
  // AggregateError from net.connect when both IPv4 and IPv6 attempts fail.
  if (Array.isArray(e.errors) && e.errors.some(isDatabaseUnavailable)) return true;
  return typeof e.message === 'string' && CONNECTION_MESSAGES.some((re) => re.test(e.message!));
}

/** Rethrows a connection failure as 503 with Retry-After; anything else unchanged. */
export function asUnavailable(err: unknown): unknown {
  return isDatabaseUnavailable(err)
    ? new UnavailableError('The metrics store is unreachable right now; nothing from this request was stored. Retry later.', DB_RETRY_AFTER_SECONDS)
    : err;
}
