import { z } from 'zod';

/**
 * HAR 1.2 ("HTTP Archive format", W3C Web Performance WG editor's draft, Odvarko & Jain), the
 * parts an import needs. Fields the specification requires and the import uses are required here;
 * size and bookkeeping fields that some exporters leave out default sensibly. Unknown and custom
 * (`_name`) fields are ignored, except Chrome's `_resourceType`, a useful classification hint.
 */

const nameValue = z.object({ name: z.string(), value: z.string() });

const harCookie = z.object({
  name: z.string(),
  value: z.string(),
  path: z.string().optional(),
  domain: z.string().optional(),
  expires: z.string().nullable().optional(),
  httpOnly: z.boolean().optional(),
  secure: z.boolean().optional(),
});

// "-1 if the info is not available" (headersSize, bodySize, content.size).
const sizeOrMinusOne = z.number().int('must be a whole number of bytes').min(-1, 'must be -1 (not available) or more').default(-1);

// blocked, dns, connect, ssl: "-1 if the timing does not apply to the current request".
const optionalTiming = z.number().min(-1, 'must be -1 (does not apply) or a non-negative number of milliseconds').optional();
// send, wait, receive: required, non-negative.
const requiredTiming = z.number({ error: 'is required (milliseconds)' }).nonnegative('must not be negative');

export const harTimingsSchema = z.object({
  blocked: optionalTiming,
  dns: optionalTiming,
  connect: optionalTiming,
  send: requiredTiming,
  wait: requiredTiming,
  receive: requiredTiming,
  ssl: optionalTiming,
});
export type HarTimings = z.infer<typeof harTimingsSchema>;

export const harPostDataSchema = z.object({
  mimeType: z.string(),
  params: z
    .array(z.object({ name: z.string(), value: z.string().optional(), fileName: z.string().optional(), contentType: z.string().optional() }))
    .optional(),
  text: z.string().optional(),
});

export const harEntrySchema = z.object({
  pageref: z.string().optional(),
  startedDateTime: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 date-time' }),
  time: z.number({ error: 'is required (milliseconds)' }).nonnegative('must not be negative'),
  request: z.object({
    method: z.string().min(1, 'is required'),
    url: z.url({ error: 'must be an absolute URL' }),
    httpVersion: z.string().default(''),
    cookies: z.array(harCookie).default([]),
    headers: z.array(nameValue),
    queryString: z.array(nameValue).default([]),
    postData: harPostDataSchema.optional(),
    headersSize: sizeOrMinusOne,
    bodySize: sizeOrMinusOne,
  }),
  response: z.object({
    status: z.number().int('must be a whole number'),
    statusText: z.string().default(''),
    httpVersion: z.string().default(''),
    cookies: z.array(harCookie).default([]),
    headers: z.array(nameValue),
    content: z.object({
      size: sizeOrMinusOne,
      compression: z.number().optional(),
      mimeType: z.string().default(''),
      text: z.string().optional(),
      encoding: z.string().optional(),
    }),
    redirectURL: z.string().default(''),
    headersSize: sizeOrMinusOne,
    bodySize: sizeOrMinusOne,
  }),
  cache: z.object({}).loose().default({}),
  timings: harTimingsSchema,
  serverIPAddress: z.string().optional(),
  connection: z.string().optional(),
  _resourceType: z.string().optional(),
});
export type HarEntry = z.infer<typeof harEntrySchema>;

export const harDocumentSchema = z.object({
  log: z.object(
    {
      version: z.string().default('1.1'),
      creator: z.object({ name: z.string(), version: z.string() }),
      browser: z.object({ name: z.string(), version: z.string() }).optional(),
      pages: z
        .array(z.object({ startedDateTime: z.string(), id: z.string(), title: z.string() }).loose())
        .optional(),
      entries: z.array(harEntrySchema, { error: 'must be a list of entries' }),
    },
    { error: 'a HAR file has a "log" object' },
  ),
});
export type HarDocument = z.infer<typeof harDocumentSchema>;

/**
 * HAR 1.2, entries/time: "Total elapsed time of the request in milliseconds. This is the sum of
 * all timings available in the timings object (i.e. not including -1 values)"; ssl is already
 * part of connect, so it is not added again.
 */
export function harEntryTime(timings: HarTimings): number {
  const parts = [timings.blocked, timings.dns, timings.connect, timings.send, timings.wait, timings.receive];
  return parts.reduce<number>((sum, t) => (t !== undefined && t >= 0 ? sum + t : sum), 0);
}
