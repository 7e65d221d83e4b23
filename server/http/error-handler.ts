import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError } from '../errors';
import type { ApiErrorBody } from '../../shared/api-types';
import { zodToValidationError } from './validate';

export const notFoundApi: RequestHandler = (req, res) => {
  const body: ApiErrorBody = { error: { code: 'not_found', message: `No such endpoint: ${req.method} ${req.path}` } };
  res.status(404).json(body);
};

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
  expose?: boolean;
}

export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let e: AppError;
    const h = err as HttpishError;
    if (err instanceof AppError) e = err;
    else if (err instanceof ZodError) e = zodToValidationError(err);
    else if (h?.type === 'entity.too.large') e = new AppError(413, 'payload_too_large', 'The request body is too large');
    else if (h?.type === 'entity.parse.failed') e = new AppError(400, 'validation', 'The request body is not valid JSON');
    else if (h?.code === 'EBADCSRFTOKEN')
      e = new AppError(403, 'csrf', 'Missing or stale x-csrf-token header: reload the page and try again');
    else if (h?.expose && typeof (h.status ?? h.statusCode) === 'number' && (h.status ?? h.statusCode)! < 500)
      e = new AppError(h.status ?? h.statusCode!, 'validation', (err as Error).message);
    else {
      log(`unhandled error on ${req.method} ${req.path}`, err);
      e = new AppError(500, 'internal', 'Something went wrong on our side; it has been logged');
    }
    if (res.headersSent) return;
    for (const [k, v] of Object.entries(e.headers)) res.setHeader(k, v);
    const body: ApiErrorBody = { error: { code: e.code, message: e.message, ...(e.field ? { field: e.field } : {}) } };
    res.status(e.status).json(body);
  };
}
