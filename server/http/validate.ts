import type { RequestHandler } from 'express';
import { ZodError, type ZodType } from 'zod';
import { ValidationError } from '../errors';

export function zodToValidationError(err: ZodError, prefix?: string): ValidationError {
  const issue = err.issues[0];
  const field = [prefix, ...(issue?.path ?? []).map(String)].filter(Boolean).join('.') || undefined;
  const message = issue ? (field ? `${field}: ${issue.message}` : issue.message) : 'Invalid input';
  return new ValidationError(message, field);
}

type Part = 'body' | 'query' | 'params';

/**
 * Parses one part of the request with a shared zod schema and stores the typed result in
 * res.locals[part]; a failure is a 400 naming the field. (Express 5's req.query is read-only.)
 */
export function validate<T>(part: Part, schema: ZodType<T>): RequestHandler {
  return (req, res, next) => {
    const result = schema.safeParse(req[part] ?? {});
    if (!result.success) return next(zodToValidationError(result.error, part === 'body' ? undefined : part));
    res.locals[part] = result.data;
    next();
  };
}
