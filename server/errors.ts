// Typed errors thrown by services; one middleware (http/error-handler.ts) maps them to HTTP.
import type { ApiErrorCode } from '../shared/api-types';

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ApiErrorCode,
    message: string,
    readonly field?: string,
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
  }
}

export class ValidationError extends AppError {
  constructor(message: string, field?: string) {
    super(400, 'validation', message, field);
  }
}
export class UnauthorizedError extends AppError {
  constructor(message = 'Sign in first') {
    super(401, 'unauthorized', message);
  }
}
export class ForbiddenError extends AppError {
  constructor(message = 'Your role cannot do this') {
    super(403, 'forbidden', message);
  }
}
export class NotFoundError extends AppError {
  constructor(what: string) {
    super(404, 'not_found', `${what} not found`);
  }
}
export class ConflictError extends AppError {
  constructor(message: string, field?: string) {
    super(409, 'conflict', message, field);
  }
}
export class UnavailableError extends AppError {
  constructor(message: string, retryAfterSeconds: number) {
    super(503, 'unavailable', message, undefined, { 'Retry-After': String(retryAfterSeconds) });
  }
}
