import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPerson, buildTestApp, signIn, TEST_PASSWORD, type SignedIn, type TestApp } from '../helpers/app';

let t: TestApp;
let admin: SignedIn;
let adminId: number;

beforeAll(async () => {
  t = await buildTestApp();
  const a = await addPerson(t, 'admin');
  adminId = a.id;
  admin = await signIn(t, a.email);
});
afterAll(() => t.close());

const post = (body: object) => admin.agent.post('/api/users').set('x-csrf-token', admin.csrf).send(body);

describe('people', () => {
  it('adds a person with a role, hashes the password and audits the change', async () => {
    const res = await post({ email: 'Wren.Okafor@Example.test', name: 'Wren Okafor', role: 'engineer', password: 'a long enough password' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'wren.okafor@example.test', role: 'engineer', disabled: false });
    expect(res.body).not.toHaveProperty('passwordHash');
    const row = await t.db.knex('users').where({ email: 'wren.okafor@example.test' }).first();
    expect(row.password_hash).toMatch(/^scrypt\$/);
    expect(row.password_hash).not.toContain('a long enough password');
    const audit = await t.db.knex('audit_events').where({ action: 'user.create', subject_id: String(row.id) }).first();
    expect(audit.actor_id).toBe(adminId);
    // The new person can sign in.
    await signIn(t, 'wren.okafor@example.test', 'a long enough password');
  });

  it.each([
    [{ name: 'No Email', role: 'reviewer', password: 'a long enough password' }, 'email'],
    [{ email: 'bad', name: 'Bad', role: 'reviewer', password: 'a long enough password' }, 'email'],
    [{ email: 'r@example.test', name: '', role: 'reviewer', password: 'a long enough password' }, 'name'],
    [{ email: 'r@example.test', name: 'R', role: 'overlord', password: 'a long enough password' }, 'role'],
    [{ email: 'r@example.test', name: 'R', role: 'reviewer', password: 'short' }, 'password'],
  ])('refuses %j naming the field %s, writing nothing', async (body, field) => {
    const before = await t.db.knex('users').count({ n: '*' }).first();
    const beforeAudit = await t.db.knex('audit_events').count({ n: '*' }).first();
    const res = await post(body);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'validation', field });
    expect(res.body.error.message).toContain(field);
    expect(await t.db.knex('users').count({ n: '*' }).first()).toEqual(before);
    expect(await t.db.knex('audit_events').count({ n: '*' }).first()).toEqual(beforeAudit);
  });

  it('refuses a second person with the same email (409, field email)', async () => {
    await post({ email: 'dup@example.test', name: 'Dup', role: 'reviewer', password: 'a long enough password' }).expect(201);
    const res = await post({ email: 'DUP@example.test', name: 'Dup 2', role: 'reviewer', password: 'a long enough password' });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'conflict', field: 'email' });
  });

  it('changes a role, and disabling someone signs them out everywhere', async () => {
    const p = await addPerson(t, 'reviewer');
    const theirs = await signIn(t, p.email);
    const up = await admin.agent.patch(`/api/users/${p.id}`).set('x-csrf-token', admin.csrf).send({ role: 'release_manager' });
    expect(up.status).toBe(200);
    expect(up.body.role).toBe('release_manager');
    expect((await theirs.agent.get('/api/auth/me').expect(200)).body.user.role).toBe('release_manager');

    const dis = await admin.agent.patch(`/api/users/${p.id}`).set('x-csrf-token', admin.csrf).send({ disabled: true });
    expect(dis.body.disabled).toBe(true);
    await theirs.agent.get('/api/auth/me').expect(401);
    await expect(signIn(t, p.email, TEST_PASSWORD)).rejects.toThrow(/401/);
    const events = await t.db.knex('audit_events').where({ action: 'user.update', subject_id: String(p.id) });
    expect(events).toHaveLength(2);
  });

  it('keeps at least one active admin', async () => {
    const res = await admin.agent.patch(`/api/users/${adminId}`).set('x-csrf-token', admin.csrf).send({ role: 'reviewer' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('role');
    expect((await t.db.knex('users').where({ id: adminId }).first()).role).toBe('admin');
  });

  it('refuses to let an admin disable their own account', async () => {
    const res = await admin.agent.patch(`/api/users/${adminId}`).set('x-csrf-token', admin.csrf).send({ disabled: true });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('disabled');
    expect((await t.db.knex('users').where({ id: adminId }).first()).disabled_at).toBeNull();
  });

  it('names bad ids and empty patches', async () => {
    const a = await admin.agent.patch('/api/users/abc').set('x-csrf-token', admin.csrf).send({ role: 'reviewer' });
    expect(a.status).toBe(400);
    expect(a.body.error.field).toBe('params.id');
    const b = await admin.agent.patch(`/api/users/${adminId}`).set('x-csrf-token', admin.csrf).send({});
    expect(b.status).toBe(400);
    const c = await admin.agent.patch('/api/users/999999').set('x-csrf-token', admin.csrf).send({ role: 'reviewer' });
    expect(c.status).toBe(404);
  });
});
