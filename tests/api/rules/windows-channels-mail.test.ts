// Maintenance windows and webhook channels (CRUD, validation, audit; the secret shown once), the
// alerts list paging, and Settings → Outgoing mail reading the real SMTP sink's messages.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMailer } from '../../../server/mail';
import { readSunkMessages, startSmtpSink, type SmtpSink } from '../../../scripts/smtp-sink';
import { channelsService } from '../../../server/rules/channels-service';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';
import { samples, store, T0, thresholdDraft } from './seed';

let t: TestApp;
let engineer: SignedIn;
let admin: SignedIn;
let sink: SmtpSink;
const secretKey = Buffer.alloc(32, 7);
const NOW = T0 + 30 * 60_000;

beforeAll(async () => {
  sink = await startSmtpSink({ port: 0, dir: fs.mkdtempSync(path.join(os.tmpdir(), 'px-outgoing-')) });
  process.env.PARALLAX_MAIL_DIR = sink.dir;
  t = await buildTestApp({ now: () => new Date(NOW), secretKey });
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  admin = await signIn(t, (await addPerson(t, 'admin')).email);
  await store(t.db.knex, samples('checkout', 'disk_free', 'gauge', {}, T0, T0 + 600_000, () => 50));
});
afterAll(async () => {
  await sink.close();
  await t.close();
});

const write = (method: 'post' | 'patch' | 'delete', p: string, body?: object) => engineer.agent[method](p).set('x-csrf-token', engineer.csrf).send(body);
const audit = (type: string) => t.db.knex('audit_events').where('subject_type', type).orderBy('id').pluck('action');

describe('maintenance windows', () => {
  it('are created, listed (active now or not), changed and deleted, each change audited', async () => {
    const iso = (ms: number) => new Date(ms).toISOString();
    const res = await write('post', '/api/maintenance-windows', { service: 'checkout', startsAt: iso(T0), endsAt: iso(T0 + 3_600_000), reason: 'db upgrade' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ service: 'checkout', startsAt: iso(T0), endsAt: iso(T0 + 3_600_000), reason: 'db upgrade', active: true });
    const bad = await write('post', '/api/maintenance-windows', { service: 'checkout', startsAt: iso(T0), endsAt: iso(T0 - 1) });
    expect([bad.status, bad.body.error.field]).toEqual([400, 'endsAt']);
    const nowhere = await write('post', '/api/maintenance-windows', { service: 'nowhere', startsAt: iso(T0), endsAt: iso(T0 + 1000) });
    expect([nowhere.status, nowhere.body.error.field]).toEqual([400, 'service']);

    const id = res.body.id;
    const moved = await write('patch', `/api/maintenance-windows/${id}`, { endsAt: iso(T0 + 60_000) });
    expect(moved.body).toMatchObject({ endsAt: iso(T0 + 60_000), active: false });
    expect((await write('patch', `/api/maintenance-windows/${id}`, { endsAt: iso(T0 - 60_000) })).body.error.field).toBe('endsAt');
    expect((await engineer.agent.get('/api/maintenance-windows?current=true')).body.items).toEqual([]);
    expect((await engineer.agent.get('/api/maintenance-windows?service=checkout')).body.items).toHaveLength(1);
    expect((await write('delete', `/api/maintenance-windows/${id}`)).status).toBe(204);
    expect((await write('delete', `/api/maintenance-windows/${id}`)).status).toBe(404);
    expect(await audit('maintenance_window')).toEqual(['maintenance_window.create', 'maintenance_window.update', 'maintenance_window.delete']);
  });
});

describe('webhook channels', () => {
  it('show the secret once, keep it sealed, rotate it, and refuse deletion while a rule uses them', async () => {
    const res = await write('post', '/api/channels', { name: 'ops', url: 'https://hooks.example.test/ops' });
    expect(res.status).toBe(201);
    const { id, secret } = res.body;
    expect(res.body.secretHint).toBe(`${secret.slice(0, 9)}…`);
    expect((await write('post', '/api/channels', { name: 'ops', url: 'https://hooks.example.test/2' })).status).toBe(409);
    expect((await write('post', '/api/channels', { name: 'x', url: 'ftp://hooks.example.test/' })).body.error.field).toBe('url');

    const listed = await engineer.agent.get('/api/channels').expect(200);
    expect(listed.body.items).toEqual([expect.objectContaining({ id, name: 'ops', url: 'https://hooks.example.test/ops' })]);
    expect(JSON.stringify(listed.body)).not.toContain(secret);
    expect(JSON.stringify(await t.db.knex('notification_channels').select('*'))).not.toContain(secret);
    expect(JSON.stringify(await t.db.knex('audit_events').select('detail'))).not.toContain(secret);
    expect((await channelsService(t.db.knex, secretKey).forDelivery(id))!.secret).toBe(secret);

    const rotated = await write('patch', `/api/channels/${id}`, { rotateSecret: true });
    expect(rotated.body.secret).toMatch(/^pxwh_/);
    expect(rotated.body.secret).not.toBe(secret);
    expect((await channelsService(t.db.knex, secretKey).forDelivery(id))!.secret).toBe(rotated.body.secret);
    expect((await write('patch', `/api/channels/${id}`, { enabled: false })).body).not.toHaveProperty('secret');

    const rule = await write('post', '/api/rules', thresholdDraft({ signal: 'disk_free', channelIds: [id] }));
    expect(rule.status, JSON.stringify(rule.body)).toBe(201);
    const busy = await write('delete', `/api/channels/${id}`);
    expect(busy.status).toBe(409);
    expect(busy.body.error.message).toContain('Disk nearly full');
    await write('delete', `/api/rules/${rule.body.id}`);
    expect((await write('delete', `/api/channels/${id}`)).status).toBe(204);
    expect(await audit('notification_channel')).toEqual(['channel.create', 'channel.update', 'channel.update', 'channel.delete']);
  });
});

describe('alerts list', () => {
  it('puts open alerts first (raised before pending), pages the history, and hides never-raised blips unless asked', async () => {
    const rule = await write('post', '/api/rules', thresholdDraft({ name: 'for alerts' }));
    const ruleId = rule.body.id;
    const at = (m: number) => new Date(T0 + m * 60_000);
    const rows = [
      { state: 'pending', opened_at: at(20) },
      { state: 'raised', opened_at: at(10), raised_at: at(11) },
      ...Array.from({ length: 5 }, (_, i) => ({ state: 'cleared', opened_at: at(i), raised_at: at(i), cleared_at: at(i + 1), end_reason: 'cleared' })),
      { state: 'cleared', opened_at: at(8), cleared_at: at(9), end_reason: 'dropped' },
    ];
    for (const [i, r] of rows.entries()) await t.db.knex('alerts').insert({ rule_id: ruleId, group_key: `["${i}"]`, ...r });
    const first = await engineer.agent.get(`/api/alerts?ruleId=${ruleId}&limit=3`).expect(200);
    expect(first.body.now.map((a: { state: string }) => a.state)).toEqual(['raised', 'pending']);
    expect(first.body.now[0].responderNote).toBe(thresholdDraft().responderNote);
    expect(first.body.history).toHaveLength(3);
    const second = await engineer.agent.get(`/api/alerts?ruleId=${ruleId}&limit=3&before=${first.body.nextBefore}`).expect(200);
    expect(second.body.now).toEqual([]);
    expect(second.body.history).toHaveLength(2);
    expect(second.body.nextBefore).toBeNull();
    const all = await engineer.agent.get(`/api/alerts?ruleId=${ruleId}&all=true`).expect(200);
    expect(all.body.history).toHaveLength(6);
    expect((await engineer.agent.get('/api/alerts/999999')).status).toBe(404);
  });
});

describe('outgoing mail', () => {
  it('shows admins what the SMTP sink received, newest first', async () => {
    const mailer = createMailer({ host: '127.0.0.1', port: sink.port, from: 'Parallax <parallax@localhost>' });
    await mailer.send(['ops@example.test'], 'first', 'one');
    await new Promise((r) => setTimeout(r, 10)); // file names order by receive time (ms)
    await mailer.send(['ops@example.test'], 'second', 'two');
    mailer.close();
    expect(readSunkMessages(sink.dir)).toHaveLength(2);
    const res = await admin.agent.get('/api/outgoing-mail').expect(200);
    expect(res.body.total).toBe(2);
    expect(res.body.items.map((m: { subject: string }) => m.subject)).toEqual(['second', 'first']);
    expect(res.body.items[0]).toMatchObject({ to: ['ops@example.test'], from: 'parallax@localhost', text: expect.stringContaining('two') });
    expect((await admin.agent.get('/api/outgoing-mail?limit=1')).body.items).toHaveLength(1);
    expect((await engineer.agent.get('/api/outgoing-mail')).status).toBe(403);
  });
});
