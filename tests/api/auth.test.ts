import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { addPerson, buildTestApp, signIn, TEST_PASSWORD, type TestApp } from '../helpers/app';

let t: TestApp;
let admin: { email: string };

beforeAll(async () => {
  t = await buildTestApp({ signInLimit: { windowMs: 60_000, max: 5 } });
  admin = await addPerson(t, 'admin');
});
afterAll(() => t.close());

function sidOf(res: request.Response): string | undefined {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  return cookies.find((c) => c.startsWith('parallax.sid='))?.split(';')[0];
}

describe('sign-in', () => {
  it('signs in, regenerates the session id and sets a hardened cookie', async () => {
    const agent = request.agent(t.app);
    const s = await agent.get('/api/auth/session').expect(200);
    expect(s.body.user).toBeNull();
    expect(typeof s.body.csrfToken).toBe('string');
    const before = sidOf(s);
    expect(before).toBeDefined();

    const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', s.body.csrfToken).send({ email: admin.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: admin.email, role: 'admin' });
    expect(res.body.csrfToken).not.toBe(s.body.csrfToken);
    const after = sidOf(res);
    expect(after).toBeDefined();
    expect(after).not.toBe(before); // session fixation defeated
    const cookie = ([] as string[]).concat(res.headers['set-cookie']).find((c) => c.startsWith('parallax.sid='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // plain HTTP here; 'auto' sets Secure over TLS

    const me = await agent.get('/api/auth/me').expect(200);
    expect(me.body.user.email).toBe(admin.email);

    // The session lives in PostgreSQL, so another server process would see it.
    const rows = await t.db.knex('sessions').select('sess');
    expect(rows.some((r) => JSON.stringify(r.sess).includes(`"user":${(me.body.user as { id: number }).id}`))).toBe(true);
  });

  it('answers wrong password, unknown person and disabled person with one message', async () => {
    const disabled = await addPerson(t, 'reviewer');
    await t.db.knex('users').where({ id: disabled.id }).update({ disabled_at: new Date() });
    const tries = [
      { email: admin.email, password: 'not the password' },
      { email: 'nobody@example.test', password: TEST_PASSWORD },
      { email: disabled.email, password: TEST_PASSWORD },
    ];
    const bodies = [];
    for (const body of tries) {
      const agent = request.agent(t.app);
      const s = await agent.get('/api/auth/session');
      const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', s.body.csrfToken).send(body);
      expect(res.status).toBe(401);
      bodies.push(res.body);
    }
    expect(bodies[0]).toEqual({ error: { code: 'unauthorized', message: 'Wrong email or password' } });
    expect(bodies[1]).toEqual(bodies[0]);
    expect(bodies[2]).toEqual(bodies[0]);
  });

  it('names the field on malformed sign-in input', async () => {
    const agent = request.agent(t.app);
    const s = await agent.get('/api/auth/session');
    const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', s.body.csrfToken).send({ email: 'not-an-email', password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'validation', field: 'email' });
  });

  it('signs out and forgets the session', async () => {
    const { agent, csrf } = await signIn(t, admin.email);
    await agent.post('/api/auth/sign-out').set('x-csrf-token', csrf).expect(204);
    await agent.get('/api/auth/me').expect(401);
    await agent.get('/api/users').expect(401);
  });
});

describe('forgery protection', () => {
  it('refuses a cookie-authenticated write without the token, or with a stale one', async () => {
    const agent = request.agent(t.app);
    const s = await agent.get('/api/auth/session');
    const noToken = await agent.post('/api/auth/sign-in').send({ email: admin.email, password: TEST_PASSWORD });
    expect(noToken.status).toBe(403);
    expect(noToken.body.error.code).toBe('csrf');

    await agent.post('/api/auth/sign-in').set('x-csrf-token', s.body.csrfToken).send({ email: admin.email, password: TEST_PASSWORD }).expect(200);
    // The pre-sign-in token died with the old session.
    const stale = await agent
      .post('/api/users')
      .set('x-csrf-token', s.body.csrfToken)
      .send({ email: 'x@example.test', name: 'X', role: 'reviewer', password: 'long enough password' });
    expect(stale.status).toBe(403);
    expect(stale.body.error.code).toBe('csrf');
    expect(await t.db.knex('users').where({ email: 'x@example.test' }).first()).toBeUndefined();
  });
});

describe('bad bodies', () => {
  it('answers malformed JSON with 400 and an oversized body with 413, and stays up', async () => {
    const { agent, csrf } = await signIn(t, admin.email);
    const bad = await agent.post('/api/users').set('x-csrf-token', csrf).set('content-type', 'application/json').send('{"email": ');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/not valid JSON/);
    const big = await agent
      .post('/api/users')
      .set('x-csrf-token', csrf)
      .set('content-type', 'application/json')
      .send(JSON.stringify({ name: 'x'.repeat(2 * 1024 * 1024) }));
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
    await request(t.app).get('/api/health').expect(200);
  });

  it('answers an unknown API path with a JSON 404', async () => {
    const res = await request(t.app).get('/api/nothing-here');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('rate limit', () => {
  it('limits sign-in attempts per address and email', async () => {
    const email = 'target@example.test';
    const statuses: number[] = [];
    let last: request.Response | undefined;
    for (let i = 0; i < 6; i++) {
      const agent = request.agent(t.app);
      const s = await agent.get('/api/auth/session');
      last = await agent.post('/api/auth/sign-in').set('x-csrf-token', s.body.csrfToken).send({ email, password: 'wrong password' });
      statuses.push(last.status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
    expect(last!.body.error.code).toBe('rate_limited');
    expect(Number(last!.headers['retry-after'])).toBeGreaterThan(0);
    // Another email from the same address is not locked out.
    await signIn(t, admin.email);
  });
});
