// Webhook notifications to a real HTTP server on 127.0.0.1: the body is signed with HMAC-SHA256
// over "<timestamp>.<body>" with the channel's secret (checked here with node:crypto directly), and
// a webhook that fails (500, then 200) is retried by pg-boss with the same delivery id and body.
import crypto from 'node:crypto';
import http from 'node:http';
import { afterEach, describe, expect, it } from 'vitest';
import { knexExecutor } from '../../../server/rules/queue-in-transaction';
import { startNotifier, type Notifier } from '../../../worker/notifier/notifier';
import { NOTE, samples, store, T0, thresholdDraft } from '../../api/rules/seed';
import { world, type World } from './world';

const MIN = 60_000;

interface Received {
  headers: http.IncomingHttpHeaders;
  body: string;
}

let w: World | null = null;
let notifier: Notifier | null = null;
let server: http.Server | null = null;
afterEach(async () => {
  await notifier?.stop();
  if (server) await new Promise((r) => server!.close(r));
  await w?.close();
  notifier = null;
  server = null;
  w = null;
});

async function receiver(statuses: number[]): Promise<{ url: string; received: Received[] }> {
  const received: Received[] = [];
  server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      received.push({ headers: req.headers, body: Buffer.concat(chunks).toString('utf8') });
      res.writeHead(statuses[Math.min(received.length - 1, statuses.length - 1)]!).end('ok');
    });
  });
  await new Promise<void>((r) => server!.listen(0, '127.0.0.1', () => r()));
  return { url: `http://127.0.0.1:${(server.address() as { port: number }).port}/hooks/parallax`, received };
}

async function until<T>(what: string, fn: () => Promise<T | undefined> | T | undefined, ms = 20_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v !== undefined) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The receiver's side, written independently of the sender: HMAC-SHA256 hex over "<timestamp>.<body>". */
function verifies(secret: string, r: Received): boolean {
  const expected = `sha256=${crypto.createHmac('sha256', secret).update(`${r.headers['x-parallax-timestamp']}.${r.body}`).digest('hex')}`;
  const given = String(r.headers['x-parallax-signature'] ?? '');
  return given.length === expected.length && crypto.timingSafeEqual(Buffer.from(given), Buffer.from(expected));
}

describe('webhook notifications', () => {
  it('are signed with the shared secret, and a failing webhook is retried until it answers 200', async () => {
    w = await world();
    // The receiver is on loopback, which the target rules refuse unless allowed (DESIGN.md §7).
    await w.t.db.knex('settings').insert({ key: 'target_policy', value: JSON.stringify({ allowLoopback: true }) });
    const hook = await receiver([500, 200]);
    notifier = await startNotifier(w.boss, w.t.db.knex, { secretKey: w.secretKey, publicUrl: 'http://parallax.test', retry: { retryLimit: 3, retryDelaySeconds: 1 }, log: () => {} });
    const ch = await w.engineer.agent.post('/api/channels').set('x-csrf-token', w.engineer.csrf).send({ name: 'ops-hook', url: hook.url });
    expect(ch.status).toBe(201);
    const secret = ch.body.secret as string;
    expect(secret).toMatch(/^pxwh_[0-9a-f]{64}$/);

    await store(w.t.db.knex, samples('checkout', 'disk_free', 'gauge', { host: 'h1' }, T0 - 10 * MIN, T0 + 10 * MIN, (t) => (t >= T0 + MIN ? 5 : 50)));
    await w.createRule(thresholdDraft({ sustain: 0, recipients: [], channelIds: [ch.body.id], groupBy: ['host'] }));
    await w.cycles(T0, T0 + 2 * MIN);

    const row = await until('the webhook delivered', async () => {
      const r = await w!.t.db.knex('notification_outbox').first();
      return r?.status === 'sent' ? r : undefined;
    });
    expect(row).toMatchObject({ channel: 'webhook', channel_id: ch.body.id, attempts: 2 });
    expect(hook.received).toHaveLength(2);
    for (const r of hook.received) {
      expect(r.headers['content-type']).toBe('application/json');
      expect(verifies(secret, r)).toBe(true);
      expect(verifies(`${secret}x`, r)).toBe(false);
      expect(r.headers['x-parallax-delivery']).toBe(`parallax-outbox-${row.id}`);
      expect(r.headers['x-parallax-event']).toBe('alert.raised');
    }
    // The retry carries the same message (only its timestamp and signature are new).
    expect(hook.received[1]!.body).toBe(hook.received[0]!.body);
    const body = JSON.parse(hook.received[1]!.body);
    expect(body).toMatchObject({
      id: `parallax-outbox-${row.id}`,
      event: 'alert.raised',
      alert: { transition: 'raised', labels: { host: 'h1' }, value: 5 },
      rule: { name: 'Disk nearly full', service: 'checkout', severity: 'page', responderNote: NOTE },
    });
    expect(body.links.alert).toBe(`http://parallax.test/alerts/${body.alert.id}`);
    expect(row.last_error).toBeNull();
  });

  it('obeys the target rules: a refused address is not posted to and not retried', async () => {
    w = await world();
    const hook = await receiver([200]);
    notifier = await startNotifier(w.boss, w.t.db.knex, { secretKey: w.secretKey, retry: { retryLimit: 3, retryDelaySeconds: 1 }, log: () => {} });
    const ch = await w.engineer.agent.post('/api/channels').set('x-csrf-token', w.engineer.csrf).send({ name: 'local', url: hook.url });
    await store(w.t.db.knex, samples('checkout', 'disk_free', 'gauge', {}, T0 - 10 * MIN, T0 + 10 * MIN, () => 5));
    await w.createRule(thresholdDraft({ sustain: 0, recipients: [], channelIds: [ch.body.id] }));
    await w.cycleAt(T0);
    const row = await until('the delivery refused', async () => {
      const r = await w!.t.db.knex('notification_outbox').first();
      return r?.status === 'failed' ? r : undefined;
    });
    expect(row.attempts).toBe(1);
    expect(row.last_error).toMatch(/refused.*loopback/i);
    expect(hook.received).toEqual([]);
  });

  it('queues a notification job in the same transaction as its write: a rollback leaves no job', async () => {
    w = await world();
    await expect(
      w.t.db.knex.transaction(async (tx) => {
        const id = await w!.boss.send('rules.notify-webhook', { outboxId: 999 }, { db: knexExecutor(tx) });
        expect(id).toMatch(/^[0-9a-f-]{36}$/);
        throw new Error('roll back');
      }),
    ).rejects.toThrow('roll back');
    const jobs = await w.t.db.knex.raw("SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'rules.notify-webhook'");
    expect(jobs.rows[0].n).toBe(0);
    await w.t.db.knex.transaction(async (tx) => {
      await w!.boss.send('rules.notify-webhook', { outboxId: 1000 }, { db: knexExecutor(tx) });
    });
    const kept = await w.t.db.knex.raw("SELECT data FROM pgboss.job WHERE name = 'rules.notify-webhook'");
    expect(kept.rows).toEqual([{ data: { outboxId: 1000 } }]);
  });
});
