// Mail notifications through pg-boss and nodemailer into the real local SMTP sink: the message
// carries the responder note first, the rule, value, group and links; a retried or duplicated
// job never sends a second message; a relay that is down is retried and finally marked failed.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { readSunkMessages, startSmtpSink, type SmtpSink } from '../../../scripts/smtp-sink';
import { outboxRepo } from '../../../server/rules/repositories/outbox-repo';
import { startNotifier, type Notifier } from '../../../worker/notifier/notifier';
import { NOTE, samples, store, T0, thresholdDraft } from '../../api/rules/seed';
import { world, type World } from './world';

const MIN = 60_000;
let w: World | null = null;
let sink: SmtpSink | null = null;
let notifier: Notifier | null = null;
afterEach(async () => {
  await notifier?.stop();
  await sink?.close();
  await w?.close();
  notifier = null;
  sink = null;
  w = null;
});

async function until<T>(what: string, fn: () => Promise<T | undefined> | T | undefined, ms = 20_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v !== undefined) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function setUp() {
  w = await world();
  sink = await startSmtpSink({ port: 0, dir: fs.mkdtempSync(path.join(os.tmpdir(), 'px-rules-mail-')) });
  notifier = await startNotifier(w.boss, w.t.db.knex, {
    secretKey: w.secretKey,
    mail: { host: '127.0.0.1', port: sink.port, from: 'Parallax <parallax@localhost>' },
    publicUrl: 'http://parallax.test:8080/',
    retry: { retryLimit: 2, retryDelaySeconds: 1 },
    log: () => {},
  });
  // Low disk between +2 and +6 min on host h1.
  await store(w.t.db.knex, samples('checkout', 'disk_free', 'gauge', { host: 'h1' }, T0 - 10 * MIN, T0 + 20 * MIN, (t) => (t >= T0 + 2 * MIN && t < T0 + 6 * MIN ? 5 : 50)));
  const ruleId = await w.createRule(thresholdDraft({ groupBy: ['host'], sustain: '30s', clear: '30s', recipients: ['ops@example.test', 'oncall@example.test'], runbookUrl: 'https://wiki.example.test/disk' }));
  return { ruleId, w, sink, notifier };
}

describe('mail notifications', () => {
  it('arrive in the SMTP sink with the responder note first, and one per transition', async () => {
    const { ruleId, w, sink } = await setUp();
    await w.cycles(T0, T0 + 3 * MIN);
    const [raised] = await until('the raise mail', () => {
      const m = readSunkMessages(sink.dir);
      return m.length ? m : undefined;
    });
    const alert = await w.t.db.knex('alerts').first();
    expect(raised!.to).toEqual(['ops@example.test', 'oncall@example.test']);
    expect(raised!.subject).toBe('[PAGE] Raised: Disk nearly full — host=h1');
    const lines = raised!.text.split('\n');
    expect(lines[0]).toBe('Responder note (check or do this first):');
    expect(lines[1]).toBe(NOTE);
    expect(raised!.text).toContain('Service: checkout');
    expect(raised!.text).toContain('Group: host=h1');
    expect(raised!.text).toContain('Value: 5');
    expect(raised!.text).toContain('Condition: last of disk_free over 1m (mean per group) < 10');
    expect(raised!.text).toContain('Runbook: https://wiki.example.test/disk');
    expect(raised!.text).toContain(`Alert: http://parallax.test:8080/alerts/${alert.id}`);
    expect(raised!.text).toContain(`Rule: http://parallax.test:8080/alerts/rules/${ruleId}`);
    const row = await until('the outbox row marked sent', async () => {
      const r = (await outboxRepo.forAlert(w.t.db.knex, alert.id))[0];
      return r?.status === 'sent' ? r : undefined;
    });
    expect(row.attempts).toBe(1);

    await w.cycles(T0 + 3 * MIN + 15_000, T0 + 8 * MIN);
    const all = await until('the clear mail', () => {
      const m = readSunkMessages(sink.dir);
      return m.length >= 2 ? m : undefined;
    });
    expect(all.map((m) => m.subject)).toEqual(['[PAGE] Raised: Disk nearly full — host=h1', '[PAGE] Cleared: Disk nearly full — host=h1']);
    expect(all[1]!.text.split('\n')[1]).toBe(NOTE);
    expect(all[1]!.text).toContain('Why: the condition was false for the clear time');
  });

  it('never sends twice when a job is retried or runs twice at once', async () => {
    const { w, sink, notifier } = await setUp();
    await w.cycles(T0, T0 + 3 * MIN);
    await until('the raise mail', () => (readSunkMessages(sink.dir).length ? true : undefined));
    const [row] = await w.t.db.knex('notification_outbox').select('*');
    await until('sent', async () => ((await outboxRepo.byId(w.t.db.knex, row.id))?.status === 'sent' ? true : undefined));

    // A retry of the same job (as pg-boss does after a lost completion) finds the row sent.
    const again = await w.boss.send('rules.notify-mail', { outboxId: row.id });
    await until('the repeated job', async () => {
      const j = await w.boss.getJobById('rules.notify-mail', again!);
      return j?.state === 'completed' ? j : undefined;
    });
    expect(await notifier.deliver(row.id)).toBe('already_sent');
    expect(readSunkMessages(sink.dir)).toHaveLength(1);

    // Two deliveries of one new row at the same moment: the row lock lets exactly one send.
    const [id] = await outboxRepo.insert(w.t.db.knex, [
      { alertId: row.alert_id, ruleId: row.rule_id, transition: 'raised', channel: 'mail', channelId: null, recipients: ['ops@example.test'], payload: { ...row.payload, ruleName: 'Twice' } },
    ]);
    const outcomes = await Promise.all([notifier.deliver(id!), notifier.deliver(id!)]);
    expect(outcomes.sort()).toEqual(['already_sent', 'sent']);
    expect(readSunkMessages(sink.dir).filter((m) => m.subject.includes('Twice'))).toHaveLength(1);
    expect((await outboxRepo.byId(w.t.db.knex, id!))!.attempts).toBe(1);
  });

  it('records a failed attempt when the relay is down, and marks the row failed when no retry is left', async () => {
    const { w } = await setUp();
    const closed = await startSmtpSink({ port: 0, dir: fs.mkdtempSync(path.join(os.tmpdir(), 'px-rules-down-')) });
    const port = closed.port;
    await closed.close();
    const down = await startNotifier(w.boss, w.t.db.knex, { secretKey: w.secretKey, mail: { host: '127.0.0.1', port, from: 'p@localhost' }, log: () => {}, concurrency: 0 });
    try {
      const alertId = (await w.t.db.knex('alerts').insert({ rule_id: (await w.t.db.knex('alert_rules').first('id')).id, group_key: '[]', state: 'raised', opened_at: new Date(T0) }).returning('id'))[0].id;
      const [id] = await outboxRepo.insert(w.t.db.knex, [
        {
          alertId,
          ruleId: 1,
          transition: 'raised',
          channel: 'mail',
          channelId: null,
          recipients: ['ops@example.test'],
          payload: { alertId, ruleId: 1, ruleName: 'r', service: 'checkout', kind: 'threshold', severity: 'page', transition: 'raised', responderNote: NOTE, runbookUrl: null, condition: 'c', labels: {}, value: 1, at: new Date(T0).toISOString(), openedAt: new Date(T0).toISOString(), raisedAt: null, reason: null },
        },
      ]);
      await expect(down.deliver(id!)).rejects.toThrow();
      expect(await outboxRepo.byId(w.t.db.knex, id!)).toMatchObject({ status: 'pending', attempts: 1 });
      await expect(down.deliver(id!, { final: true })).rejects.toThrow();
      const failed = await outboxRepo.byId(w.t.db.knex, id!);
      expect(failed).toMatchObject({ status: 'failed', attempts: 2 });
      expect(failed!.lastError).toMatch(/ECONNREFUSED|connect/i);
    } finally {
      await down.stop();
    }
  });
});
