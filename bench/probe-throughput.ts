// Probe throughput: many single-step journeys against a local target.
//  A. Capacity: a burst of due slots queued at once; runs completed *and stored* per second by
//     one prober process, against a raw undici request loop at the same concurrency (same run).
//  B. Punctuality: journeys on a 10 s schedule driven by the real scheduler; start lateness of
//     each stored run (p50 / p99).
// Run: npx tsx bench/probe-throughput.ts [journeys=1000]
import crypto from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { Agent, request } from 'undici';
import { journeyDocumentSchema } from '../shared/journey/journey-schema';
import { probeQueue } from '../shared/jobs';
import { journeysService } from '../server/services/journeys';
import { probeSettingsService } from '../server/services/probe-settings';
import { startBoss } from '../worker/boss';
import { startProber } from '../worker/probe-job';
import { createScheduler, slotJobId } from '../worker/scheduler';
import { percentile, startPrivateDb } from './lib/private-db';

const BURST = Number(process.argv[2] ?? 1000);
const CONCURRENCY = 16;
const SYSTEM = { type: 'token' as const, id: 0, name: 'bench', scopes: [] };

async function main() {
  const target = http.createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end('{"ok":true}');
  });
  await new Promise<void>((r) => target.listen(0, '127.0.0.1', () => r()));
  const url = `http://127.0.0.1:${(target.address() as AddressInfo).port}/`;

  // Baselines: the same number of requests through undici at the same concurrency. The prober
  // opens a fresh connection for every run on purpose (each run measures its own DNS/TCP/TLS), so
  // the fair baseline does too; the keep-alive figure is printed for scale.
  async function rawLoop(fresh: boolean): Promise<number> {
    const agent = new Agent({ connections: CONCURRENCY });
    let next = 0;
    const t0 = performance.now();
    await Promise.all(
      Array.from({ length: CONCURRENCY }, async () => {
        while (next++ < BURST) {
          const r = await request(url, { dispatcher: agent, reset: fresh });
          await r.body.text();
        }
      }),
    );
    const rate = BURST / ((performance.now() - t0) / 1000);
    await agent.close();
    return rate;
  }
  await rawLoop(false); // warm-up
  const keepAliveRate = await rawLoop(false);
  const rawRate = await rawLoop(true);

  const pdb = await startPrivateDb(54361);
  try {
    const db = pdb.knex;
    await db('vantages').insert({ name: 'bench' });
    await probeSettingsService(db).setTargetPolicy(SYSTEM, { allow: [], deny: [], allowLoopback: true, allowLinkLocal: false });
    const svc = journeysService(db);
    const doc = (i: number) =>
      journeyDocumentSchema.parse({
        name: `bench ${i}`,
        steps: [{ name: 'get', method: 'GET', url, assertions: [{ kind: 'status', in: [200] }] }],
        schedule: { kind: 'interval', everySeconds: 10 },
        vantages: ['bench'],
      });
    const ids: number[] = [];
    for (let i = 0; i < BURST; i++) ids.push((await svc.create(SYSTEM, doc(i), [])).id);
    await db('journeys').update({ enabled: false }); // phase A queues by hand

    const boss = await startBoss(pdb.settings);
    const queue = probeQueue('bench');
    await boss.createQueue(queue);
    const slot = new Date(Math.floor(Date.now() / 1000) * 1000);
    await boss.insert(
      ids.map((id) => ({
        name: queue,
        id: slotJobId(id, 'bench', slot),
        data: { kind: 'scheduled', journeyId: id, version: 1, vantage: 'bench', slotAt: slot.toISOString() },
      })),
    );
    const t1 = performance.now();
    const stop = await startProber(boss, db, { vantage: 'bench', secretKey: crypto.randomBytes(32), concurrency: CONCURRENCY, lateAfterMs: 3_600_000 });
    for (;;) {
      const n = Number((await db('runs').count({ n: '*' }).first())!.n);
      if (n >= BURST) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    const storedRate = BURST / ((performance.now() - t1) / 1000);
    const verdicts = (await db('runs').select('verdict').count({ n: '*' }).groupBy('verdict')) as { verdict: string; n: number }[];

    // Phase B: a sustainable schedule through the real scheduler.
    await db('runs').delete();
    const scheduled = Math.min(200, BURST);
    await db('journeys').whereIn('id', ids.slice(0, scheduled)).update({ enabled: true });
    const scheduler = createScheduler(boss, db, pdb.settings, { log: () => {} });
    scheduler.start();
    await new Promise((r) => setTimeout(r, 32_000));
    await scheduler.stop();
    await new Promise((r) => setTimeout(r, 3_000));
    const lateness = (await db('runs').where({ trigger: 'schedule' }).select('lateness_ms')).map((r) => Number(r.lateness_ms)).sort((a, b) => a - b);
    await stop();
    await boss.stop({ graceful: false, wait: true });

    console.log(`probe throughput (${BURST} single-step runs, concurrency ${CONCURRENCY}, one prober process)`);
    console.log(`  raw undici loop:        ${rawRate.toFixed(0)} requests/s, a fresh connection each (keep-alive: ${keepAliveRate.toFixed(0)}/s)`);
    console.log(`  prober, run + stored:   ${storedRate.toFixed(0)} runs/s   verdicts ${verdicts.map((v) => `${v.verdict}=${v.n}`).join(' ')}`);
    console.log(`  ratio (target ≥ 0.5):   ${(storedRate / rawRate).toFixed(2)}`);
    console.log(`start lateness (${scheduled} journeys every 10 s for 32 s, ${lateness.length} runs)`);
    console.log(`  p50 ${percentile(lateness, 0.5).toFixed(0)} ms   p99 ${percentile(lateness, 0.99).toFixed(0)} ms   (target p99 < 1000 ms)`);
  } finally {
    await pdb.close();
    target.close();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
