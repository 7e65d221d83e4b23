import type { z } from 'zod';
import { isApiError } from '../../hooks/api-client';

export type FieldErrors<K extends string> = Partial<Record<K, string>>;

export type Checked<S extends z.ZodType> =
  | { ok: true; data: z.output<S>; errors: Record<string, never> }
  | { ok: false; errors: FieldErrors<string> };

/** Validate form values with the shared schema; the first message per field wins. */
export function checkForm<S extends z.ZodType>(schema: S, values: unknown): Checked<S> {
  const result = schema.safeParse(values);
  if (result.success) return { ok: true, data: result.data, errors: {} };
  const errors: FieldErrors<string> = {};
  for (const issue of result.error.issues) {
    const key = issue.path.length > 0 ? String(issue.path[0]) : 'form';
    if (errors[key] === undefined) errors[key] = issue.message;
  }
  return { ok: false, errors };
}

/** The field a server refusal points at, if it names one of this form's fields. */
export function serverFieldError<K extends string>(error: unknown, fields: readonly K[]): FieldErrors<K> | null {
  if (!isApiError(error) || !error.field) return null;
  const field = error.field.split('.')[0] as K;
  if (!fields.includes(field)) return null;
  return { [field]: error.message } as FieldErrors<K>;
}
