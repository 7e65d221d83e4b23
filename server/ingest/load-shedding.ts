// A cap on intake requests in progress. Past it the intake answers 429 with Retry-After (OTLP
// clients back off and retry, RFC 6585 §4) instead of queueing work until memory or the
// connection pool runs out.
import type { RequestHandler } from 'express';
import { AppError } from '../errors';

export class TooManyRequestsError extends AppError {
  constructor(retryAfterSeconds: number) {
    super(429, 'rate_limited', 'The metrics intake is busy; retry shortly', undefined, { 'Retry-After': String(retryAfterSeconds) });
  }
}

export function inFlightLimit(max: number, retryAfterSeconds = 1): RequestHandler {
  let inFlight = 0;
  return (_req, res, next) => {
    if (inFlight >= max) return next(new TooManyRequestsError(retryAfterSeconds));
    inFlight++;
    let released = false;
    const release = () => {
      if (!released) {
        released = true;
        inFlight--;
      }
    };
    res.on('finish', release);
    res.on('close', release);
    next();
  };
}
