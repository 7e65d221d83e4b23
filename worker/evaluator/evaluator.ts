// The evaluator: every cycle (default 15 s) the leader (one per database, by advisory lock)
// evaluates every enabled rule and records the alerts' transitions and notifications. The clock
// is injectable; state lives in PostgreSQL (open alerts), so a restarted or new leader carries on
// where the last one stopped, pending-since and all.
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import { DEFAULT_CYCLE_MS } from '../../shared/rules/replay';
import { ensureNotifyQueues } from '../notifier/queues';
import { runEvaluationCycle, type CycleSummary } from './cycle';
import { advisoryLeader } from './leader-lock';

/** "peva": the evaluator's advisory lock (the scheduler holds "para"). */
export const EVALUATOR_LOCK_KEY = 0x70657661;

export interface EvaluatorOptions {
  /** Default PARALLAX_EVALUATOR_CYCLE_MS or 15 000. */
  cycleMs?: number;
  now?: () => Date;
  /** A series silent this long is gone rather than "no data" (default 1 h). */
  staleAfterMs?: number;
  /** false: no timer; the caller runs cycles (tests with an injected clock). Default true. */
  autoStart?: boolean;
  log?: (msg: string) => void;
}

export interface Evaluator {
  /** One cycle now, if this process leads (null when another one does). */
  runCycle(): Promise<CycleSummary | null>;
  isLeader(): boolean;
  stop(): Promise<void>;
}

export async function startEvaluator(boss: PgBoss, db: Knex, opts: EvaluatorOptions = {}): Promise<Evaluator> {
  const now = opts.now ?? (() => new Date());
  const cycleMs = opts.cycleMs ?? Number(process.env.PARALLAX_EVALUATOR_CYCLE_MS ?? DEFAULT_CYCLE_MS);
  const staleAfterMs = opts.staleAfterMs ?? 3_600_000;
  const log = opts.log ?? ((m: string) => console.log(`[evaluator] ${m}`));
  const leader = advisoryLeader(db, EVALUATOR_LOCK_KEY, log);
  await ensureNotifyQueues(boss);

  let chain: Promise<unknown> = Promise.resolve();
  let timer: NodeJS.Timeout | null = null;
  let stopped = false;

  async function cycle(): Promise<CycleSummary | null> {
    if (!(await leader.tryLead())) return null;
    const at = now().getTime();
    try {
      const summary = await runEvaluationCycle(db, boss, at, { staleAfterMs, log });
      await db('evaluator_state')
        .insert({ id: 'evaluator', last_cycle_at: new Date(at), last_cycle_ms: Math.round(summary.ms.total), rules: summary.rules, groups: summary.groups, last_error: summary.errors[0] ?? null })
        .onConflict('id')
        .merge();
      if (summary.ms.total > cycleMs) log(`cycle took ${Math.round(summary.ms.total)} ms, longer than the ${cycleMs} ms interval`);
      return summary;
    } catch (e) {
      await db('evaluator_state')
        .insert({ id: 'evaluator', last_cycle_at: new Date(at), last_cycle_ms: 0, rules: 0, groups: 0, last_error: (e as Error).message })
        .onConflict('id')
        .merge()
        .catch(() => {});
      throw e;
    }
  }

  // Cycles never overlap: a manual runCycle() waits for a timed one and vice versa.
  const runCycle = () => {
    const p = chain.then(cycle, cycle);
    chain = p.catch(() => undefined);
    return p;
  };

  const schedule = (delay: number) => {
    if (stopped) return;
    timer = setTimeout(async () => {
      const started = Date.now();
      try {
        await runCycle();
      } catch (e) {
        log(`cycle failed: ${(e as Error).message}`);
      }
      schedule(Math.max(0, cycleMs - (Date.now() - started)));
    }, delay);
  };
  if (opts.autoStart ?? true) schedule(0);

  return {
    runCycle,
    isLeader: leader.isLeader,
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      await chain;
      await leader.release();
    },
  };
}
