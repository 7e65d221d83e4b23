// The scheduler: one leader at a time (a PostgreSQL advisory lock held on its own connection)
// turns due slots into probe jobs on each vantage's queue. Every job's id is derived from
// (journey, vantage, slot), so restarts, retries and a second scheduler can never queue a slot
// twice, and runs are unique per slot in the database as well. pg-boss cron has minute
// resolution, so this is a loop of its own (journeys may run every 10 s).
import crypto from 'node:crypto';
import type { Knex } from 'knex';
import pg from 'pg';
import type PgBoss from 'pg-boss';
import { slotsBetween } from '../shared/journey/schedule';
import { probeQueue, type ScheduledProbeJob } from '../shared/jobs';
import type { DbSettings } from '../server/config';
import { journeysRepo } from '../server/repositories/journeys';
import { runsRepo, type RunKey } from '../server/repositories/runs';

const LOCK_KEY = 0x70617261; // "para": the scheduler's advisory lock
const STATE_ID = 'scheduler';

export interface SchedulerOptions {
  now?: () => Date;
  tickMs?: number;
  /** Slots are queued this far ahead, held back by pg-boss until their time (startAfter). */
  lookaheadMs?: number;
  /** A slot older than this when first seen was missed (scheduler down): recorded void, not run. */
  missedAfterMs?: number;
  /** At most this many missed slots per journey and vantage are recorded after an outage. */
  maxMissedPerSeries?: number;
  log?: (msg: string) => void;
}

export interface TickResult {
  leader: boolean;
  queued: number;
  missed: number;
}

/** A UUID-shaped id that is the same for the same slot everywhere. */
export function slotJobId(journeyId: number, vantage: string, slotAt: Date): string {
  const h = crypto.createHash('sha256').update(`${journeyId}|${vantage}|${slotAt.toISOString()}`).digest('hex');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-a${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

export function createScheduler(boss: PgBoss, db: Knex, settings: DbSettings, opts: SchedulerOptions = {}) {
  const now = opts.now ?? (() => new Date());
  const tickMs = opts.tickMs ?? 1000;
  const lookaheadMs = opts.lookaheadMs ?? 5000;
  const missedAfterMs = opts.missedAfterMs ?? 60_000;
  const maxMissed = opts.maxMissedPerSeries ?? 1000;
  const log = opts.log ?? ((m: string) => console.log(`[scheduler] ${m}`));
  const knownQueues = new Set<string>();
  let lockClient: pg.Client | null = null;
  let leader = false;
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<unknown> = Promise.resolve();

  async function tryLead(): Promise<boolean> {
    if (leader) return true;
    if (!lockClient) {
      lockClient = new pg.Client({ ...settings });
      lockClient.on('error', () => {
        // Losing the connection loses the lock: step down and try again next tick.
        leader = false;
        lockClient = null;
      });
      await lockClient.connect();
    }
    const r = await lockClient.query('SELECT pg_try_advisory_lock($1) AS ok', [LOCK_KEY]);
    leader = r.rows[0].ok === true;
    if (leader) log('leading');
    return leader;
  }

  async function ensureQueue(name: string) {
    if (knownQueues.has(name)) return;
    await boss.createQueue(name, { name, retryLimit: 2, retryDelay: 1, expireInSeconds: 60 } as PgBoss.Queue);
    knownQueues.add(name);
  }

  async function tick(): Promise<TickResult> {
    if (!(await tryLead())) return { leader: false, queued: 0, missed: 0 };
    const t = now();
    const state = await db('scheduler_state').where({ id: STATE_ID }).first();
    const from = state ? new Date(state.last_tick_at) : new Date(t.getTime() - tickMs);
    const until = new Date(t.getTime() + lookaheadMs);
    if (until <= from) return { leader: true, queued: 0, missed: 0 };

    const missed: RunKey[] = [];
    let queued = 0;
    for (const j of await journeysRepo.listCurrent(db, { enabledOnly: true })) {
      let slots: Date[];
      try {
        slots = slotsBetween(j.document.schedule, j.id, from, until, 100_000);
      } catch {
        slots = [];
        log(`journey ${j.id}: too many slots since the last tick; recording none`);
      }
      for (const vantage of j.document.vantages) {
        const late = slots.filter((s) => t.getTime() - s.getTime() > missedAfterMs).slice(-maxMissed);
        for (const s of late) missed.push({ journeyId: j.id, version: j.version, vantage, slotAt: s });
        const due = slots.filter((s) => t.getTime() - s.getTime() <= missedAfterMs);
        if (!due.length) continue;
        const queue = probeQueue(vantage);
        // A run that outlives every step's timeout has lost its worker (killed): pg-boss hands the
        // job to another worker then, and the slot's uniqueness keeps it to one stored run.
        const expireIn = Math.ceil(j.document.steps.reduce((sum, st) => sum + st.timeoutMs, 0) / 1000) + 5;
        await ensureQueue(queue);
        for (const s of due) {
          const job: ScheduledProbeJob = { kind: 'scheduled', journeyId: j.id, version: j.version, vantage, slotAt: s.toISOString() };
          const id = await boss.send(queue, job, { id: slotJobId(j.id, vantage, s), startAfter: s, retryLimit: 2, retryDelay: 1, expireInSeconds: expireIn });
          if (id) queued++;
        }
      }
    }
    const missedCount = await runsRepo.insertMissed(db, missed, 'missed: no scheduler was running at this slot');
    await db('scheduler_state').insert({ id: STATE_ID, last_tick_at: until }).onConflict('id').merge();
    return { leader: true, queued, missed: missedCount };
  }

  return {
    tick,
    isLeader: () => leader,
    start() {
      const loop = () => {
        running = tick()
          .catch((e: Error) => log(`tick failed: ${e.message}`))
          .finally(() => {
            if (timer !== null) timer = setTimeout(loop, tickMs);
          });
      };
      timer = setTimeout(loop, 0);
    },
    async stop() {
      const t = timer;
      timer = null;
      if (t) clearTimeout(t);
      await running;
      if (lockClient) {
        await lockClient.end().catch(() => {});
        lockClient = null;
      }
      leader = false;
    },
  };
}
