// A vantage's prober: takes its queue's jobs, runs the journey, stores the run once per slot.
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import { referencedSecretNames } from '../shared/journey/template';
import type { JourneyDocument } from '../shared/journey/journey-schema';
import type { RunResult } from '../shared/journey/run-result';
import { probeJobSchema, probeQueue, type ProbeJob } from '../shared/jobs';
import { journeysRepo } from '../server/repositories/journeys';
import { runsRepo } from '../server/repositories/runs';
import { probeSettingsService } from '../server/services/probe-settings';
import { secretsService } from '../server/services/secrets';
import { runJourney, type RunJourneyOptions } from './prober';

export interface ProberOptions {
  vantage: string;
  secretKey: Buffer;
  /** Parallel runs this process takes from its queue. */
  concurrency?: number;
  now?: () => Date;
  /** A scheduled run that starts later than this after its slot is void (late), not run. */
  lateAfterMs?: number;
  /** Test hook: how runs reach the network (e.g. a resolver or CA for local HTTPS). */
  agent?: RunJourneyOptions['agent'];
}

export function voidResult(vantage: string, reason: string, at: Date): RunResult {
  return {
    verdict: 'void',
    vantage,
    startedAt: at.toISOString(),
    finishedAt: at.toISOString(),
    durationMs: 0,
    failureClass: null,
    failedStep: null,
    voidReason: reason,
    steps: [],
  };
}

export async function startProber(boss: PgBoss, db: Knex, opts: ProberOptions): Promise<() => Promise<void>> {
  const now = opts.now ?? (() => new Date());
  const lateAfterMs = opts.lateAfterMs ?? 30_000;
  const secrets = secretsService(db, opts.secretKey);
  const settings = probeSettingsService(db);
  const queue = probeQueue(opts.vantage);
  const shutdown = new AbortController();

  async function execute(doc: JourneyDocument): Promise<RunResult> {
    const names = referencedSecretNames(doc.steps);
    return runJourney(doc, {
      vantage: opts.vantage,
      secrets: await secrets.reveal(names),
      targetPolicy: await settings.targetPolicy(),
      signal: shutdown.signal,
      agent: opts.agent,
    });
  }

  async function handle(job: ProbeJob): Promise<RunResult | { stored: number | null }> {
    if (job.kind === 'try') return execute(job.document as JourneyDocument);
    const slotAt = new Date(job.slotAt);
    const key = { journeyId: job.journeyId, version: job.version, vantage: job.vantage, slotAt };
    const start = now();
    const lateness = start.getTime() - slotAt.getTime();
    let result: RunResult;
    if (lateness > lateAfterMs) {
      result = voidResult(opts.vantage, `started ${Math.round(lateness / 1000)} s after its slot (limit ${lateAfterMs / 1000} s)`, start);
    } else {
      const j = await journeysRepo.byId(db, job.journeyId, job.version);
      if (!j) return { stored: null }; // the journey was deleted since the slot was queued
      try {
        result = await execute(j.document);
      } catch (e) {
        result = voidResult(opts.vantage, `runner error: ${(e as Error).message}`, start);
      }
    }
    return { stored: await runsRepo.insertOnce(db, key, result, Math.max(0, lateness)) };
  }

  await boss.createQueue(queue, { name: queue, retryLimit: 2, retryDelay: 1, expireInSeconds: 60 } as PgBoss.Queue);
  const workers: string[] = [];
  for (let i = 0; i < (opts.concurrency ?? 4); i++) {
    workers.push(
      await boss.work(queue, { pollingIntervalSeconds: 0.5, batchSize: 1 }, async ([job]) => {
        return handle(probeJobSchema.parse(job!.data));
      }),
    );
  }
  return async () => {
    shutdown.abort();
    await boss.offWork(queue);
  };
}
