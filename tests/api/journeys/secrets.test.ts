// Secrets: encrypted at rest, admin-only, never in any API answer or table in plain text.
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';

let t: TestApp;
let admin: SignedIn;
let engineer: SignedIn;
const VALUE = 'kettle-token-7f3a9c2e51b84d06';

/** Every row of every table of ours, as text. */
async function wholeDatabaseText(): Promise<string> {
  const tables = await t.db.knex.raw("SELECT tablename FROM pg_tables WHERE schemaname = 'public'");
  let all = '';
  for (const { tablename } of tables.rows as { tablename: string }[]) {
    const r = await t.db.knex.raw(`SELECT coalesce(string_agg(x::text, '|'), '') AS s FROM ?? x`, [tablename]);
    all += r.rows[0].s;
  }
  return all;
}

beforeAll(async () => {
  t = await buildTestApp();
  admin = await signIn(t, (await addPerson(t, 'admin')).email);
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
});
afterAll(() => t.close());

describe('secrets', () => {
  it('stores a value encrypted and never answers with it', async () => {
    const put = await admin.agent.put('/api/secrets/SHOP_TOKEN').set('x-csrf-token', admin.csrf).send({ value: VALUE });
    expect(put.status).toBe(201);
    expect(JSON.stringify(put.body)).not.toContain(VALUE);
    const again = await admin.agent.put('/api/secrets/SHOP_TOKEN').set('x-csrf-token', admin.csrf).send({ value: VALUE + 'x' });
    expect(again.status).toBe(200);
    const list = await admin.agent.get('/api/secrets').expect(200);
    expect(list.body.items.map((s: { name: string }) => s.name)).toEqual(['SHOP_TOKEN']);
    expect(JSON.stringify(list.body)).not.toContain(VALUE);
    const text = await wholeDatabaseText();
    expect(text).not.toContain(VALUE);
    expect(text).not.toContain(Buffer.from(VALUE).toString('hex'));
    expect(text).not.toContain(Buffer.from(VALUE).toString('base64'));
  });

  it('is admin-only', async () => {
    expect((await engineer.agent.get('/api/secrets')).status).toBe(403);
    expect((await engineer.agent.put('/api/secrets/X').set('x-csrf-token', engineer.csrf).send({ value: 'v' })).status).toBe(403);
  });

  it('names bad secret names and empty values', async () => {
    const a = await admin.agent.put('/api/secrets/has-dash').set('x-csrf-token', admin.csrf).send({ value: 'v' });
    expect(a.status).toBe(400);
    expect(a.body.error.field).toBe('params.name');
    const b = await admin.agent.put('/api/secrets/OK_NAME').set('x-csrf-token', admin.csrf).send({ value: '' });
    expect(b.body.error.field).toBe('value');
  });

  it('imports a HAR recording: credentials become stored secrets, the draft has placeholders only', async () => {
    // A HAR 1.2 document (W3C Web Performance WG editor's draft, "HTTP Archive (HAR) format"):
    // log.version, log.creator, log.entries[] with request, response, cache and timings.
    const bearer = 'Bearer har-recorded-credential-93b1c7d2';
    const har = {
      log: {
        version: '1.2',
        creator: { name: 'hand-written', version: '1' },
        entries: [
          {
            startedDateTime: '2026-11-30T10:00:00.000Z',
            time: 50,
            request: {
              method: 'GET',
              url: 'https://shop.example.test/api/search?q=oolong',
              httpVersion: 'HTTP/1.1',
              cookies: [],
              headers: [{ name: 'Authorization', value: bearer }, { name: 'Accept', value: 'application/json' }],
              queryString: [{ name: 'q', value: 'oolong' }],
              headersSize: -1,
              bodySize: 0,
            },
            response: {
              status: 200,
              statusText: 'OK',
              httpVersion: 'HTTP/1.1',
              cookies: [],
              headers: [],
              content: { size: 2, mimeType: 'application/json', text: '[]' },
              redirectURL: '',
              headersSize: -1,
              bodySize: 2,
            },
            cache: {},
            timings: { blocked: -1, dns: -1, connect: -1, send: 1, wait: 40, receive: 9, ssl: -1 },
          },
        ],
      },
    };
    const file = path.join(fs.mkdtempSync('/tmp/px-har-'), 'shop.har');
    fs.writeFileSync(file, JSON.stringify(har));
    const res = await engineer.agent.post('/api/journeys/import-har').set('x-csrf-token', engineer.csrf).attach('file', file);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(JSON.stringify(res.body)).not.toContain('har-recorded-credential-93b1c7d2');
    expect(res.body.secrets).toHaveLength(1);
    const name = res.body.secrets[0].name;
    expect(JSON.stringify(res.body.draft)).toContain(`{{secret.${name}}}`);
    expect(await wholeDatabaseText()).not.toContain('har-recorded-credential-93b1c7d2');
    expect((await admin.agent.get('/api/secrets')).body.items.map((s: { name: string }) => s.name)).toContain(name);

    fs.writeFileSync(file, '{"log": {"version": "1.2", "entries": "nope"}}');
    const bad = await engineer.agent.post('/api/journeys/import-har').set('x-csrf-token', engineer.csrf).attach('file', file);
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('file');
    expect(bad.body.error.message).toMatch(/entries/);
  });
});
