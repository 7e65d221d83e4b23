// A vantage's prober: takes its queue's jobs, runs the journey, stores the run once per slot.
import { setMaxListeners } from 'node:events';
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
  // Every run in flight listens on the one shutdown signal (and each step again).
  setMaxListeners(0, shutdown.signal);

  // A journey version never changes once saved, so it is read once per process.
  const versions = new Map<string, Promise<JourneyDocument | null>>();
  const documentOf = (id: number, version: number) => {
    const k = `${id}:${version}`;
    if (!versions.has(k)) {
      if (versions.size > 5000) versions.clear();
      versions.set(k, journeysRepo.byId(db, id, version).then((j) => j?.document ?? null));
    }
    return versions.get(k)!;
  };
  // Target rules are read at most every few seconds; an admin's change applies within that time.
  let policy: { at: number; value: ReturnType<typeof settings.targetPolicy> } | null = null;
  const targetPolicy = () => {
    if (!policy || Date.now() - policy.at > 5000) policy = { at: Date.now(), value: settings.targetPolicy() };
    return policy.value;
  };

  async function execute(doc: JourneyDocument): Promise<RunResult> {
    const names = referencedSecretNames(doc.steps);
    return runJourney(doc, {
      vantage: opts.vantage,
      secrets: names.length ? await secrets.reveal(names) : {},
      targetPolicy: await targetPolicy(),
      signal: shutdown.signal,
      agent: opts.agent,
    });
  }

  // Finished runs are written in small batches (one transaction, two statements) and their jobs
  // completed together: per-run round trips, not probing, were what limited a worker.
  let pending: { item: Parameters<typeof runsRepo.insertManyOnce>[1][number]; jobId: string; done: (e?: Error) => void }[] = [];
  let flushTimer: NodeJS.Timeout | null = null;
  const flush = async () => {
    flushTimer = null;
    const batch = pending;
    pending = [];
    if (!batch.length) return;
    try {
      await runsRepo.insertManyOnce(db, batch.map((b) => b.item));
      await boss.complete(queue, batch.map((b) => b.jobId));
      for (const b of batch) b.done();
    } catch (e) {
      for (const b of batch) b.done(e as Error);
    }
  };
  const store = (jobId: string, item: Parameters<typeof runsRepo.insertManyOnce>[1][number]) =>
    new Promise<void>((resolve, reject) => {
      pending.push({ item, jobId, done: (e) => (e ? reject(e) : resolve()) });
      if (pending.length >= 32) void flush();
      else flushTimer ??= setTimeout(() => void flush(), 20);
    });

  /** Runs one job; a scheduled run is handed to the batch writer, which also completes its job. */
  async function handle(jobId: string, job: ProbeJob): Promise<{ output: object } | 'stored'> {
    if (job.kind === 'try') return { output: await execute(job.document as JourneyDocument) };
    const slotAt = new Date(job.slotAt);
    const key = { journeyId: job.journeyId, version: job.version, vantage: job.vantage, slotAt };
    const start = now();
    const lateness = start.getTime() - slotAt.getTime();
    let result: RunResult;
    if (lateness > lateAfterMs) {
      result = voidResult(opts.vantage, `started ${Math.round(lateness / 1000)} s after its slot (limit ${lateAfterMs / 1000} s)`, start);
    } else {
      const doc = await documentOf(job.journeyId, job.version);
      if (!doc) return { output: { stored: null } }; // the journey was deleted since the slot was queued
      try {
        result = await execute(doc);
      } catch (e) {
        result = voidResult(opts.vantage, `runner error: ${(e as Error).message}`, start);
      }
    }
    await store(jobId, { key, result, latenessMs: Math.max(0, lateness) });
    return 'stored';
  }

  await boss.createQueue(queue, { name: queue, retryLimit: 2, retryDelay: 1, expireInSeconds: 60 } as PgBoss.Queue);

  // Our own fetch loop rather than boss.work(): work() waits its polling interval after every
  // batch, which caps a worker at a couple of jobs a second. Here up to `concurrency` runs are in
  // flight, a freed place is refilled at once, and an idle queue is polled every 200 ms.
  const concurrency = opts.concurrency ?? 8;
  let inFlight = 0;
  let stopped = false;
  let wake: (() => void) | null = null;
  const idle = (ms: number) => new Promise<void>((r) => { const t = setTimeout(r, ms); wake = () => { clearTimeout(t); r(); }; });
  const settle = async (job: PgBoss.Job<unknown>) => {
    try {
      const out = await handle(job.id, probeJobSchema.parse(job.data));
      if (out !== 'stored') await boss.complete(queue, job.id, out.output);
    } catch (e) {
      await boss.fail(queue, job.id, { message: (e as Error).message }).catch(() => {});
    } finally {
      inFlight--;
      wake?.();
    }
  };
  const loop = (async () => {
    while (!stopped) {
      const free = concurrency - inFlight;
      if (free <= 0) {
        await idle(1000);
        continue;
      }
      let jobs: PgBoss.Job<unknown>[] = [];
      try {
        jobs = (await boss.fetch(queue, { batchSize: free })) ?? [];
      } catch (e) {
        console.error(`[prober] fetch failed: ${(e as Error).message}`);
      }
      for (const job of jobs) {
        inFlight++;
        void settle(job);
      }
      if (jobs.length === 0) await idle(200);
    }
  })();

  return async () => {
    stopped = true;
    shutdown.abort();
    wake?.();
    await loop;
    while (inFlight > 0) await new Promise((r) => setTimeout(r, 50));
    if (flushTimer) clearTimeout(flushTimer);
    await flush();
  };
}
