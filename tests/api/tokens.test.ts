import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../helpers/app';

let t: TestApp;
let admin: SignedIn;

beforeAll(async () => {
  t = await buildTestApp();
  admin = await signIn(t, (await addPerson(t, 'admin')).email);
});
afterAll(() => t.close());

describe('API tokens', () => {
  it('shows the secret once, stores only its hash, and records last use', async () => {
    const res = await admin.agent.post('/api/tokens').set('x-csrf-token', admin.csrf).send({ name: 'pipeline', scopes: ['read', 'releases'] });
    expect(res.status).toBe(201);
    const secret: string = res.body.secret;
    expect(secret).toMatch(/^plx_[A-Za-z0-9_-]{32}$/);
    expect(res.body.token).toMatchObject({ name: 'pipeline', scopes: ['read', 'releases'], lastUsedAt: null, revokedAt: null });

    const list = await admin.agent.get('/api/tokens').expect(200);
    expect(JSON.stringify(list.body)).not.toContain(secret);
    // Nowhere in the database, in any table, as plain text.
    const dump = await t.db.knex.raw(
      "SELECT string_agg(t::text, '|') AS all FROM (SELECT row_to_json(x)::text AS t FROM api_tokens x UNION ALL SELECT row_to_json(a)::text FROM audit_events a) s",
    );
    expect(dump.rows[0].all).not.toContain(secret);
    expect(dump.rows[0].all).not.toContain(secret.slice(12));

    await request(t.app).get('/api/workers').set('authorization', `Bearer ${secret}`).expect(200);
    const after = await admin.agent.get('/api/tokens').expect(200);
    expect(after.body.items.find((x: { name: string }) => x.name === 'pipeline').lastUsedAt).not.toBeNull();
  });

  it('needs no CSRF token with a Bearer token, and scopes still apply', async () => {
    const c = await admin.agent.post('/api/tokens').set('x-csrf-token', admin.csrf).send({ name: 'ingest-only', scopes: ['ingest'] });
    const res = await request(t.app).get('/api/workers').set('authorization', `Bearer ${c.body.secret}`);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/read/);
  });

  it('refuses revoked, unknown and malformed tokens with 401', async () => {
    const c = await admin.agent.post('/api/tokens').set('x-csrf-token', admin.csrf).send({ name: 'short-lived', scopes: ['read'] });
    await admin.agent.delete(`/api/tokens/${c.body.token.id}`).set('x-csrf-token', admin.csrf).expect(204);
    for (const h of [`Bearer ${c.body.secret}`, 'Bearer plx_nothing', 'Basic abc', 'Bearer']) {
      const res = await request(t.app).get('/api/workers').set('authorization', h);
      expect(res.status).toBe(401);
    }
    const listed = (await admin.agent.get('/api/tokens')).body.items.find((x: { id: number }) => x.id === c.body.token.id);
    expect(listed.revokedAt).not.toBeNull();
    expect(await t.db.knex('audit_events').where({ action: 'token.revoke' }).count({ n: '*' }).first()).toEqual({ n: 1 });
  });

  it('names the field on bad input and writes nothing', async () => {
    const before = (await t.db.knex('api_tokens').count({ n: '*' }).first())!.n;
    for (const [body, field] of [
      [{ name: '', scopes: ['read'] }, 'name'],
      [{ name: 'x', scopes: [] }, 'scopes'],
      [{ name: 'x', scopes: ['everything'] }, 'scopes.0'],
    ] as const) {
      const res = await admin.agent.post('/api/tokens').set('x-csrf-token', admin.csrf).send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect((await t.db.knex('api_tokens').count({ n: '*' }).first())!.n).toBe(before);
    const r = await admin.agent.delete('/api/tokens/424242').set('x-csrf-token', admin.csrf);
    expect(r.status).toBe(404);
  });
});
