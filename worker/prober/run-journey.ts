import { type JourneyDocument, type JourneyDocumentInput, describeIssues, journeyDocumentSchema } from '../../shared/journey/journey-schema';
import { redactSecrets } from '../../shared/journey/redact';
import type { RunResult, StepResult } from '../../shared/journey/run-result';
import type { TargetPolicyInput } from '../../shared/journey/target-policy-schema';
import { type ProbeAgent, createProbeAgent } from './probe-agent';
import { runStep } from './run-step';

export interface Clock {
  /** Wall-clock epoch milliseconds (startedAt / finishedAt). */
  now(): number;
}

export type ProbeAgentFactory = (policy: TargetPolicyInput) => ProbeAgent;

export interface RunJourneyOptions {
  /** Secret name → value, decrypted; only those the journey references are needed. */
  secrets: Readonly<Record<string, string>>;
  vantage: string;
  targetPolicy: TargetPolicyInput;
  /** Shutdown: aborting makes the run void (missing data), never failed. */
  signal?: AbortSignal;
  clock?: Clock;
  /**
   * Builds the agent for one run (default: createProbeAgent with the target policy). A run gets
   * its own agent, so it measures fresh DNS/TCP/TLS and its connection log is its own; tests
   * inject one with a fake resolver or an extra CA.
   */
  agent?: ProbeAgentFactory;
  userAgent?: string;
}

const systemClock: Clock = { now: () => Date.now() };

/**
 * Runs a journey once: steps in order, stopping at the first failing one. `fail` means the target
 * misbehaved; `void` means the runner could not run it (invalid document, missing secret, shutdown,
 * internal error) and is missing data, never a failure.
 */
export async function runJourney(doc: JourneyDocument | JourneyDocumentInput, options: RunJourneyOptions): Promise<RunResult> {
  const clock = options.clock ?? systemClock;
  const startedAt = clock.now();
  const monoStart = performance.now();
  const steps: StepResult[] = [];
  const finish = (verdict: RunResult['verdict'], extra: Partial<RunResult> = {}): RunResult => ({
    verdict,
    vantage: options.vantage,
    startedAt: new Date(startedAt).toISOString(),
    finishedAt: new Date(clock.now()).toISOString(),
    durationMs: performance.now() - monoStart,
    failureClass: null,
    failedStep: null,
    voidReason: null,
    steps,
    ...extra,
  });
  const voided = (reason: string) => finish('void', { voidReason: redactSecrets(reason, options.secrets) });

  const parsed = journeyDocumentSchema.safeParse(doc);
  if (!parsed.success) return voided(`invalid journey document: ${describeIssues(parsed.error).join('; ')}`);
  const signal = options.signal ?? new AbortController().signal;
  if (signal.aborted) return voided('run aborted before it started');

  let agent: ProbeAgent | undefined;
  try {
    agent = (options.agent ?? ((policy) => createProbeAgent({ policy })))(options.targetPolicy);
    const variables: Record<string, string> = {};
    const userAgent = options.userAgent ?? `Parallax-Prober/0.1 (vantage ${options.vantage})`;
    for (const [index, step] of parsed.data.steps.entries()) {
      const outcome = await runStep(step, index, {
        agent,
        variables,
        secrets: options.secrets,
        userAgent,
        signal,
        now: () => performance.now(),
      });
      if (outcome.kind === 'void') return voided(outcome.reason);
      steps.push(outcome.result);
      if (!outcome.result.passed) return finish('fail', { failureClass: outcome.result.failureClass, failedStep: index });
      Object.assign(variables, outcome.captured);
    }
    return finish('pass');
  } catch (error) {
    return voided(`internal error: ${error instanceof Error ? error.message : String(error)}`);
  } finally {
    await agent?.close().catch(() => undefined);
  }
}
