import { type Dispatcher, request } from 'undici';
import { evaluateAssertions } from '../../shared/journey/assertions';
import { extractCaptures } from '../../shared/journey/captures';
import type { ObservedResponse } from '../../shared/journey/observed-response';
import { redactSecrets } from '../../shared/journey/redact';
import { type FailureClass, RESPONSE_EXCERPT_BYTES, type StepResult, type StepTimings } from '../../shared/journey/run-result';
import type { Step } from '../../shared/journey/step-schema';
import { TemplateError, renderTemplate } from '../../shared/journey/template';
import { generateTraceparent } from '../../shared/journey/trace-context';
import { classifyRequestError } from './classify-error';
import type { ConnectionRecord, ProbeAgent } from './probe-agent';

/** Responses are read up to this many bytes; assertions see that prefix. */
export const MAX_BODY_BYTES = 1024 * 1024;

const REDIRECT_STATUSES = new Set([301, 302, 303, 307, 308]);
/** Credentials are not carried to another origin by a redirect (as browsers and curl do). */
const CREDENTIAL_HEADERS = new Set(['authorization', 'proxy-authorization', 'cookie']);

export interface StepRunContext {
  agent: ProbeAgent;
  variables: Readonly<Record<string, string>>;
  secrets: Readonly<Record<string, string>>;
  userAgent: string;
  /** The run's signal: aborting it (shutdown) makes the run void, not failed. */
  signal: AbortSignal;
  /** Monotonic milliseconds. */
  now: () => number;
}

export type StepOutcome =
  | { kind: 'done'; result: StepResult; captured: Record<string, string> }
  | { kind: 'void'; reason: string };

type HeaderList = Array<[string, string]>;

function errorMessage(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/** The first RESPONSE_EXCERPT_BYTES of the body, redacted before it is cut so no secret is half-kept. */
export function responseExcerpt(body: string, secrets: Readonly<Record<string, string>>): string {
  const bytes = Buffer.from(redactSecrets(body, secrets), 'utf8');
  if (bytes.length <= RESPONSE_EXCERPT_BYTES) return bytes.toString('utf8');
  return bytes.subarray(0, RESPONSE_EXCERPT_BYTES).toString('utf8').replace(/\uFFFD+$/, '');
}

async function readBody(body: AsyncIterable<Buffer>, limit: number): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of body) {
    if (size + chunk.length > limit) {
      chunks.push(chunk.subarray(0, limit - size));
      break; // leaving the loop destroys the stream; the rest is not downloaded
    }
    chunks.push(chunk);
    size += chunk.length;
  }
  return Buffer.concat(chunks).toString('utf8');
}

/**
 * undici does not reject a request whose connection is still being set up when its signal
 * aborts (a hung lookup, a silent firewall), so the step stops waiting on its own. The orphaned
 * request ends when the run destroys its agent.
 */
function untilAborted<T>(work: Promise<T>, signal: AbortSignal): Promise<T> {
  work.catch(() => undefined); // settles after the step has moved on: nobody is listening then
  if (signal.aborted) return Promise.reject(signal.reason);
  return new Promise<T>((resolve, reject) => {
    const onAbort = () => reject(signal.reason);
    signal.addEventListener('abort', onAbort, { once: true });
    work.then(
      (value) => {
        signal.removeEventListener('abort', onAbort);
        resolve(value);
      },
      (error) => {
        signal.removeEventListener('abort', onAbort);
        reject(error);
      },
    );
  });
}

/** One value per name; repeats are combined as RFC 9110 §5.3 allows (cookies with "; ", RFC 6265 §5.4). */
function headerRecord(headers: HeaderList): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [name, value] of headers) {
    const key = name.toLowerCase();
    out[key] = key in out ? `${out[key]}${key === 'cookie' ? '; ' : ', '}${value}` : value;
  }
  return out;
}

function headerText(value: string | string[] | undefined): string | undefined {
  return Array.isArray(value) ? value[0] : value;
}

function milestones(stepStart: number, hopStart: number, conn: ConnectionRecord | undefined, ttfbAt: number | null, endAt: number): StepTimings {
  const since = (t: number | null | undefined) => (t === null || t === undefined ? null : t - stepStart);
  return {
    redirectMs: hopStart - stepStart,
    dnsMs: since(conn?.dnsDoneAt),
    connectMs: since(conn?.connectDoneAt),
    tlsMs: since(conn?.tlsDoneAt),
    ttfbMs: since(ttfbAt),
    totalMs: endAt - stepStart,
  };
}

export async function runStep(step: Step, index: number, ctx: StepRunContext): Promise<StepOutcome> {
  const redact = (text: string) => redactSecrets(text, ctx.secrets);
  const stepStart = ctx.now();
  let url: URL;
  let method: string = step.method;
  let body: string | undefined;
  let headers: HeaderList;
  try {
    const render = (template: string) => renderTemplate(template, { variables: ctx.variables, secrets: ctx.secrets });
    url = new URL(render(step.url));
    headers = step.headers.map((h): [string, string] => [h.name, render(h.value)]);
    body = step.body ? render(step.body) : undefined;
  } catch (error) {
    if (error instanceof TemplateError || error instanceof TypeError) return { kind: 'void', reason: `step ${index} (${step.name}) could not be prepared: ${redact(errorMessage(error))}` };
    throw error;
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') {
    return { kind: 'void', reason: `step ${index} (${step.name}): ${url.protocol} URLs cannot be probed` };
  }
  if (!headers.some(([name]) => name.toLowerCase() === 'user-agent')) headers.push(['user-agent', ctx.userAgent]);

  const controller = new AbortController();
  let timedOut = false;
  const timer = setTimeout(() => {
    timedOut = true;
    controller.abort(new Error(`step timed out after ${step.timeoutMs} ms`));
  }, step.timeoutMs);
  const onShutdown = () => controller.abort(ctx.signal.reason);
  ctx.signal.addEventListener('abort', onShutdown, { once: true });

  const firstUrl = redact(url.href);
  const redirects: StepResult['redirects'] = [];
  let traceId = '';
  let hopStart = stepStart;
  let hopMark = ctx.agent.connections.length;
  let conn: ConnectionRecord | undefined;
  let ttfbAt: number | null = null;
  let status: number | null = null;

  const finish = (fields: Partial<StepResult> & Pick<StepResult, 'passed'>, endAt = ctx.now()): StepResult => ({
    index,
    name: step.name,
    method: step.method,
    url: firstUrl,
    httpStatus: status,
    timings: milestones(stepStart, hopStart, conn, ttfbAt, endAt),
    redirects,
    traceId,
    assertions: [],
    captures: {},
    failureClass: null,
    error: null,
    responseExcerpt: null,
    ...fields,
  });
  const failed = (failureClass: FailureClass, error: string, extra: Partial<StepResult> = {}, endAt?: number): StepOutcome => ({
    kind: 'done',
    result: finish({ passed: false, failureClass, error: redact(error), ...extra }, endAt),
    captured: {},
  });

  try {
    if (ctx.signal.aborted) return { kind: 'void', reason: `run aborted before step ${index}` };
    for (;;) {
      const trace = generateTraceparent();
      traceId = trace.traceId;
      hopStart = ctx.now();
      hopMark = ctx.agent.connections.length;
      conn = undefined;
      ttfbAt = null;
      status = null;
      const response = await untilAborted(request(url, {
        dispatcher: ctx.agent.dispatcher,
        method: method as Dispatcher.HttpMethod,
        headers: headerRecord([...headers, ['traceparent', trace.header]]),
        body,
        signal: controller.signal,
        // A fresh connection per request: every step measures its own DNS, TCP and TLS, rather
        // than depending on whether undici happened to keep the previous socket.
        reset: true,
      }), controller.signal);
      ttfbAt = ctx.now();
      conn = ctx.agent.connections.slice(hopMark).at(-1);
      status = response.statusCode;
      const location = headerText(response.headers.location);

      if (step.followRedirects && REDIRECT_STATUSES.has(status) && location) {
        await response.body.dump();
        if (redirects.length >= step.maxRedirects) {
          return failed('status', `stopped at redirect ${redirects.length + 1}: the step allows at most ${step.maxRedirects}`);
        }
        let next: URL;
        try {
          next = new URL(location, url);
        } catch {
          return failed('status', `redirected to an invalid Location: ${location}`);
        }
        redirects.push({ status, location: redact(next.href) });
        if (next.protocol !== 'http:' && next.protocol !== 'https:') {
          return failed('status', `redirected to a ${next.protocol} URL, which cannot be probed`);
        }
        // RFC 9110 §15.4: 303 (and, as every client does, 301/302 after POST) continue with GET.
        if ((status === 303 && method !== 'HEAD') || ((status === 301 || status === 302) && method === 'POST')) {
          method = 'GET';
          body = undefined;
          headers = headers.filter(([name]) => !/^content-(type|length)$/i.test(name));
        }
        if (next.origin !== url.origin) headers = headers.filter(([name]) => !CREDENTIAL_HEADERS.has(name.toLowerCase()));
        url = next;
        continue;
      }

      const bodyText = method === 'HEAD' ? '' : await readBody(response.body, MAX_BODY_BYTES);
      if (method === 'HEAD') await response.body.dump();
      const endAt = ctx.now();
      const observed: ObservedResponse = { status, headers: response.headers, bodyText, totalMs: endAt - stepStart };
      const outcomes = evaluateAssertions(step.assertions, observed);
      const assertions = outcomes.map((a) => ({ ...a, expected: redact(a.expected), actual: redact(a.actual) }));
      const failedAssertion = outcomes.find((a) => !a.passed);
      if (failedAssertion) {
        const statusFailed = outcomes.some((a) => !a.passed && a.kind === 'status');
        return failed(
          statusFailed ? 'status' : 'assertion',
          `${failedAssertion.expected}, got ${failedAssertion.actual}`,
          { assertions, responseExcerpt: responseExcerpt(bodyText, ctx.secrets) },
          endAt,
        );
      }
      const captures = extractCaptures(step.captures, observed);
      const shown = Object.fromEntries(Object.entries(captures.values).map(([k, v]) => [k, redact(v)]));
      if (!captures.ok) {
        return failed(
          'capture',
          `could not capture ${captures.name}: ${captures.reason}`,
          { assertions, captures: shown, responseExcerpt: responseExcerpt(bodyText, ctx.secrets) },
          endAt,
        );
      }
      return { kind: 'done', result: finish({ passed: true, assertions, captures: shown }, endAt), captured: captures.values };
    }
  } catch (error) {
    if (ctx.signal.aborted) return { kind: 'void', reason: `run aborted during step ${index}: ${errorMessage(ctx.signal.reason ?? 'shutting down')}` };
    conn ??= ctx.agent.connections.slice(hopMark).at(-1); // how far a failed connection got
    if (timedOut) return failed('timeout', `no complete response within ${step.timeoutMs} ms`);
    const failureClass = classifyRequestError(error);
    if (failureClass === null) return { kind: 'void', reason: `runner error in step ${index}: ${redact(errorMessage(error))}` };
    return failed(failureClass, errorMessage(error));
  } finally {
    clearTimeout(timer);
    ctx.signal.removeEventListener('abort', onShutdown);
  }
}
