// The worker's first real job: proof of life. A timer queues one heartbeat job per period
// (deduplicated per worker and period); the handler records it, so the heartbeat shown on "Now"
// proves the whole path: timer → queue in PostgreSQL → handler → table.
import os from 'node:os';
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import { heartbeatJobSchema, JOBS, type HeartbeatJob } from '../shared/jobs';
import { heartbeatsRepo } from '../server/repositories/heartbeats';

export interface HeartbeatOptions {
  name: string;
  beatSeconds: number;
  now?: () => Date;
}

export async function startHeartbeat(boss: PgBoss, db: Knex, opts: HeartbeatOptions): Promise<() => Promise<void>> {
  const now = opts.now ?? (() => new Date());
  await boss.createQueue(JOBS.heartbeat);
  await boss.work<HeartbeatJob>(JOBS.heartbeat, { pollingIntervalSeconds: 0.5 }, async (jobs) => {
    for (const job of jobs) {
      const hb = heartbeatJobSchema.parse(job.data);
      // An upsert keyed by worker name: a retried job writes the same row again, never a second one.
      await heartbeatsRepo.beat(db, { ...hb, startedAt: new Date(hb.startedAt), lastBeatAt: now() });
    }
  });

  const startedAt = now().toISOString();
  const send = () =>
    boss
      .send(
        JOBS.heartbeat,
        { name: opts.name, host: os.hostname(), pid: process.pid, startedAt, beatSeconds: opts.beatSeconds } satisfies HeartbeatJob,
        { singletonKey: `beat:${opts.name}`, singletonSeconds: Math.max(1, opts.beatSeconds - 1), expireInSeconds: 60 },
      )
      .catch((e: Error) => console.error('[worker] heartbeat not queued:', e.message));
  await send();
  const timer = setInterval(send, opts.beatSeconds * 1000);
  return async () => {
    clearInterval(timer);
    await boss.offWork(JOBS.heartbeat);
  };
}
