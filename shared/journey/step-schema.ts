import { z } from 'zod';
import { JsonPathError, parseJsonPath } from './json-path';
import { TEMPLATE_NAME_PATTERN, TemplateError, templateRefs } from './template';

/** Limits a step may ask for; the prober enforces the same bounds. */
export const STEP_LIMITS = {
  minTimeoutMs: 100,
  maxTimeoutMs: 120_000,
  defaultTimeoutMs: 10_000,
  maxRedirects: 10,
  defaultMaxRedirects: 5,
  maxBodyChars: 64 * 1024,
} as const;

export const HTTP_METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'] as const;

function regexSchema(field: string) {
  return z
    .string({ error: `${field} must be a regular expression` })
    .min(1, `${field} must not be empty`)
    .max(500, `${field} must be at most 500 characters`)
    .refine((source) => {
      try {
        new RegExp(source);
        return true;
      } catch {
        return false;
      }
    }, `${field} is not a valid regular expression`);
}

const flagsSchema = z
  .string()
  .regex(/^(?!.*(.).*\1)[ims]*$/, 'flags may only be i, m and s, each at most once')
  .optional();

function jsonPathSchema(field: string) {
  return z
    .string({ error: `${field} must be a JSON path such as $.items[0].id` })
    .max(500, `${field} must be at most 500 characters`)
    .superRefine((path, ctx) => {
      try {
        parseJsonPath(path);
      } catch (error) {
        ctx.addIssue({ code: 'custom', message: error instanceof JsonPathError ? error.message : String(error) });
      }
    });
}

function templateSchema(field: string, max: number) {
  return z
    .string({ error: `${field} must be text` })
    .max(max, `${field} must be at most ${max} characters`)
    .superRefine((template, ctx) => {
      try {
        templateRefs(template);
      } catch (error) {
        ctx.addIssue({ code: 'custom', message: error instanceof TemplateError ? error.message : String(error) });
      }
    });
}

const headerNameSchema = z
  .string({ error: 'header name must be text' })
  .regex(/^[!#$%&'*+\-.^_`|~0-9A-Za-z]+$/, 'header name must be a valid HTTP token (letters, digits, - and a few symbols)')
  .max(200, 'header name must be at most 200 characters');

/** Headers that describe the connection or the framing, or that the prober sets itself. */
const PROBER_HEADERS = new Set(['connection', 'content-length', 'transfer-encoding', 'keep-alive', 'upgrade', 'expect', 'te', 'traceparent']);

const requestHeaderNameSchema = headerNameSchema.superRefine((name, ctx) => {
  if (PROBER_HEADERS.has(name.toLowerCase())) ctx.addIssue({ code: 'custom', message: `header ${name} is set by the prober itself` });
});

const variableNameSchema = z
  .string({ error: 'variable name must be text' })
  .regex(TEMPLATE_NAME_PATTERN, 'variable name must start with a letter or _ and use only letters, digits and _')
  .max(64, 'variable name must be at most 64 characters');

export const JSON_COMPARISONS = ['eq', 'ne', 'lt', 'le', 'gt', 'ge', 'exists'] as const;

export const assertionSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('status'),
      in: z
        .array(z.number().int().min(100, 'status codes are 100–599').max(599, 'status codes are 100–599'), {
          error: 'status "in" must be a list of status codes',
        })
        .min(1, 'status "in" needs at least one status code'),
    }),
    z.object({
      kind: z.literal('latency'),
      underMs: z
        .number({ error: 'latency underMs must be a number of milliseconds' })
        .int('latency underMs must be a whole number of milliseconds')
        .positive('latency underMs must be above 0'),
    }),
    z.object({ kind: z.literal('header-equals'), header: headerNameSchema, value: z.string().max(2000) }),
    z.object({ kind: z.literal('header-matches'), header: headerNameSchema, pattern: regexSchema('header pattern'), flags: flagsSchema }),
    z.object({ kind: z.literal('body-contains'), text: z.string().min(1, 'body text must not be empty').max(2000) }),
    z.object({ kind: z.literal('body-matches'), pattern: regexSchema('body pattern'), flags: flagsSchema }),
    z
      .object({
        kind: z.literal('json'),
        path: jsonPathSchema('json path'),
        op: z.enum(JSON_COMPARISONS, { error: `json op must be one of ${JSON_COMPARISONS.join(', ')}` }),
        value: z.json().optional(),
      })
      .superRefine((a, ctx) => {
        if (a.op === 'exists') return;
        if (a.value === undefined) ctx.addIssue({ code: 'custom', path: ['value'], message: `json op ${a.op} needs a value to compare with` });
        else if (['lt', 'le', 'gt', 'ge'].includes(a.op) && typeof a.value !== 'number') {
          ctx.addIssue({ code: 'custom', path: ['value'], message: `json op ${a.op} compares numbers: value must be a number` });
        }
      }),
  ],
  { error: 'assertion kind must be status, latency, header-equals, header-matches, body-contains, body-matches or json' },
);
export type Assertion = z.infer<typeof assertionSchema>;

export const captureSchema = z.discriminatedUnion(
  'from',
  [
    z.object({ from: z.literal('json'), name: variableNameSchema, path: jsonPathSchema('capture path') }),
    z.object({
      from: z.literal('header'),
      name: variableNameSchema,
      header: headerNameSchema,
      /** Optional: keep only the first group of this pattern (e.g. a cookie out of set-cookie). */
      pattern: regexSchema('capture pattern').optional(),
    }),
    z.object({
      from: z.literal('regex'),
      name: variableNameSchema,
      pattern: regexSchema('capture pattern'),
      flags: flagsSchema,
      group: z.number().int().min(0, 'capture group must be 0 or more').max(99).default(1),
    }),
  ],
  { error: 'capture "from" must be json, header or regex' },
);
export type Capture = z.infer<typeof captureSchema>;

export const stepSchema = z
  .object({
    name: z.string({ error: 'step name is required' }).trim().min(1, 'step name is required').max(100, 'step name must be at most 100 characters'),
    method: z.enum(HTTP_METHODS, { error: `method must be one of ${HTTP_METHODS.join(', ')}` }),
    url: templateSchema('url', 2000).refine(
      (url) => /^https?:\/\//i.test(url) || url.startsWith('{{'),
      'url must start with http:// or https:// (or with a {{placeholder}} that holds one)',
    ),
    headers: z
      .array(z.object({ name: requestHeaderNameSchema, value: templateSchema('header value', 8000) }), {
        error: 'headers must be a list of { name, value }',
      })
      .max(50, 'a step has at most 50 headers')
      .default([]),
    body: templateSchema('body', STEP_LIMITS.maxBodyChars).nullable().optional(),
    timeoutMs: z
      .number({ error: 'timeoutMs must be a number of milliseconds' })
      .int('timeoutMs must be a whole number of milliseconds')
      .min(STEP_LIMITS.minTimeoutMs, `timeoutMs must be at least ${STEP_LIMITS.minTimeoutMs}`)
      .max(STEP_LIMITS.maxTimeoutMs, `timeoutMs must be at most ${STEP_LIMITS.maxTimeoutMs}`)
      .default(STEP_LIMITS.defaultTimeoutMs),
    followRedirects: z.boolean({ error: 'followRedirects must be true or false' }).default(false),
    maxRedirects: z
      .number({ error: 'maxRedirects must be a number' })
      .int('maxRedirects must be a whole number')
      .min(0, 'maxRedirects must be 0 or more')
      .max(STEP_LIMITS.maxRedirects, `maxRedirects must be at most ${STEP_LIMITS.maxRedirects}`)
      .default(STEP_LIMITS.defaultMaxRedirects),
    assertions: z.array(assertionSchema).max(50, 'a step has at most 50 assertions').default([]),
    captures: z.array(captureSchema).max(20, 'a step has at most 20 captures').default([]),
  })
  .superRefine((step, ctx) => {
    if (step.body && (step.method === 'GET' || step.method === 'HEAD')) {
      ctx.addIssue({ code: 'custom', path: ['body'], message: `body is not allowed with ${step.method}` });
    }
  });
export type Step = z.infer<typeof stepSchema>;
export type StepInput = z.input<typeof stepSchema>;
