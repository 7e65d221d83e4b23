// A test world for the evaluator: its own database, app, pg-boss and an injected clock.
import crypto from 'node:crypto';
import type PgBoss from 'pg-boss';
import { startBoss } from '../../../worker/boss';
import { startEvaluator, type Evaluator } from '../../../worker/evaluator/evaluator';
import type { CycleSummary } from '../../../worker/evaluator/cycle';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';
import { T0 } from '../../api/rules/seed';

export interface World {
  t: TestApp;
  boss: PgBoss;
  clock: { now: number };
  /** The app's secret key (webhook secrets are sealed with it). */
  secretKey: Buffer;
  engineer: SignedIn;
  evaluator: Evaluator;
  /** Moves the clock to `at` and runs one cycle there. */
  cycleAt(at: number): Promise<CycleSummary>;
  /** Runs a cycle every 15 s from `from` to `to` (inclusive); calls `each` after each. */
  cycles(from: number, to: number, each?: (at: number) => Promise<void>): Promise<void>;
  restartEvaluator(): Promise<void>;
  createRule(draft: object): Promise<number>;
  close(): Promise<void>;
}

export async function world(): Promise<World> {
  const clock = { now: T0 };
  const now = () => new Date(clock.now);
  const secretKey = crypto.randomBytes(32);
  const t = await buildTestApp({ now, secretKey });
  const boss = await startBoss(t.db.settings);
  const engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  const start = () => startEvaluator(boss, t.db.knex, { now, autoStart: false, log: () => {} });
  const w: World = {
    t,
    boss,
    clock,
    secretKey,
    engineer,
    evaluator: await start(),
    async cycleAt(at) {
      clock.now = at;
      const s = await w.evaluator.runCycle();
      if (!s) throw new Error('the evaluator is not leading');
      return s;
    },
    async cycles(from, to, each) {
      for (let at = from; at <= to; at += 15_000) {
        await w.cycleAt(at);
        if (each) await each(at);
      }
    },
    async restartEvaluator() {
      await w.evaluator.stop();
      w.evaluator = await start();
    },
    async createRule(draft) {
      const res = await engineer.agent.post('/api/rules').set('x-csrf-token', engineer.csrf).send(draft);
      if (res.status !== 201) throw new Error(`rule not created: ${res.status} ${JSON.stringify(res.body)}`);
      return res.body.id as number;
    },
    async close() {
      await w.evaluator.stop();
      await boss.stop({ graceful: false, wait: true });
      await t.close();
    },
  };
  return w;
}
