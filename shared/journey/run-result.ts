/**
 * What one run of a journey produced. The prober builds it; the worker stores it; the screens show
 * it. Every string in it has been through secret redaction.
 */

export const VERDICTS = ['pass', 'fail', 'void'] as const;
export type Verdict = (typeof VERDICTS)[number];

/** Why a run failed: the first failing step's problem. Void runs have no failure class. */
export const FAILURE_CLASSES = ['dns', 'connect', 'tls', 'timeout', 'status', 'assertion', 'capture', 'blocked'] as const;
export type FailureClass = (typeof FAILURE_CLASSES)[number];

/**
 * Milestones of one step in milliseconds since the step began, in curl's `time_*` sense, so each
 * is at most the next: redirectMs ≤ dnsMs ≤ connectMs ≤ tlsMs ≤ ttfbMs ≤ totalMs.
 * dns/connect/tls belong to the final request (after any redirects); the prober opens a fresh
 * connection for every request, so they are null only when the phase does not exist (an IP
 * literal has no DNS, plain HTTP no TLS) or was never reached (the connection failed earlier).
 * ttfbMs is null when no response arrived.
 */
export interface StepTimings {
  redirectMs: number;
  dnsMs: number | null;
  connectMs: number | null;
  tlsMs: number | null;
  ttfbMs: number | null;
  totalMs: number;
}

/** Durations of each phase, for a waterfall; null where the phase did not happen. */
export interface PhaseDurations {
  redirect: number;
  dns: number | null;
  connect: number | null;
  tls: number | null;
  wait: number | null;
  download: number | null;
}

export function phaseDurations(t: StepTimings): PhaseDurations {
  const minus = (a: number | null, b: number) => (a === null ? null : Math.max(0, a - b));
  const afterDns = t.dnsMs ?? t.redirectMs;
  const afterConnect = t.connectMs ?? afterDns;
  const afterTls = t.tlsMs ?? afterConnect;
  return {
    redirect: t.redirectMs,
    dns: minus(t.dnsMs, t.redirectMs),
    connect: minus(t.connectMs, afterDns),
    tls: minus(t.tlsMs, afterConnect),
    wait: minus(t.ttfbMs, afterTls),
    download: t.ttfbMs === null ? null : Math.max(0, t.totalMs - t.ttfbMs),
  };
}

export interface AssertionOutcome {
  kind: string;
  passed: boolean;
  /** What the assertion asked for, in words ("status in 200, 201"). */
  expected: string;
  /** What the response had ("503"). */
  actual: string;
}

export interface StepResult {
  index: number;
  name: string;
  method: string;
  /** The rendered URL of the first request (secrets redacted). */
  url: string;
  passed: boolean;
  /** Status of the final response; null when none arrived. */
  httpStatus: number | null;
  timings: StepTimings;
  /** Redirects followed, in order. */
  redirects: Array<{ status: number; location: string }>;
  /** Trace id of the `traceparent` sent with the step's final request. */
  traceId: string;
  assertions: AssertionOutcome[];
  /** Variables this step captured (values redacted of secrets; mask them on screen). */
  captures: Record<string, string>;
  failureClass: FailureClass | null;
  /** What went wrong, in words; null when the step passed. */
  error: string | null;
  /** Start of the failing step's response body, at most RESPONSE_EXCERPT_BYTES, secrets redacted. */
  responseExcerpt: string | null;
}

export const RESPONSE_EXCERPT_BYTES = 4096;

export interface RunResult {
  verdict: Verdict;
  vantage: string;
  /** Wall-clock ISO-8601 instants. */
  startedAt: string;
  finishedAt: string;
  durationMs: number;
  failureClass: FailureClass | null;
  /** Index of the step that failed (the run stops there); null otherwise. */
  failedStep: number | null;
  /** Why the runner could not run the journey (verdict void only). */
  voidReason: string | null;
  steps: StepResult[];
}
