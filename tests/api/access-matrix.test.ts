// Every route × every role, plus anonymous and API tokens: who may call what (DESIGN.md §2).
import crypto from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/roles';
import { tokensService } from '../../server/services/tokens';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../helpers/app';

let t: TestApp;
const sessions = {} as Record<Role, SignedIn>;
let victimId: number;
let tokenIds: number[] = [];
let tokenSecrets: Record<'ingest' | 'releases' | 'read', string>;

type Method = 'get' | 'post' | 'patch' | 'delete';
interface RouteCase {
  method: Method;
  path: () => string;
  body?: () => object;
  roles: Role[] | 'any';
  scopes: ('ingest' | 'releases' | 'read')[];
}

const unique = () => crypto.randomBytes(4).toString('hex');

const ROUTES: RouteCase[] = [
  { method: 'get', path: () => '/api/auth/me', roles: 'any', scopes: ['ingest', 'releases', 'read'] },
  { method: 'get', path: () => '/api/workers', roles: 'any', scopes: ['read'] },
  { method: 'get', path: () => '/api/users', roles: ['admin'], scopes: [] },
  {
    method: 'post',
    path: () => '/api/users',
    body: () => ({ email: `m-${unique()}@example.test`, name: 'Matrix', role: 'reviewer', password: 'a long enough password' }),
    roles: ['admin'],
    scopes: [],
  },
  { method: 'patch', path: () => `/api/users/${victimId}`, body: () => ({ role: 'reviewer' }), roles: ['admin'], scopes: [] },
  { method: 'get', path: () => '/api/tokens', roles: ['admin'], scopes: [] },
  { method: 'post', path: () => '/api/tokens', body: () => ({ name: `m-${unique()}`, scopes: ['read'] }), roles: ['admin'], scopes: [] },
  { method: 'delete', path: () => `/api/tokens/${tokenIds.pop()}`, roles: ['admin'], scopes: [] },
  { method: 'get', path: () => '/api/audit-events', roles: ['admin'], scopes: [] },
];

beforeAll(async () => {
  t = await buildTestApp();
  for (const role of ROLES) {
    const p = await addPerson(t, role);
    sessions[role] = await signIn(t, p.email);
  }
  victimId = (await addPerson(t, 'engineer')).id;
  const svc = tokensService(t.db.knex);
  const actor = { type: 'user' as const, id: 1, email: 'x', name: 'x', role: 'admin' as const };
  for (let i = 0; i < 10; i++) tokenIds.push((await svc.create(actor, { name: `spare-${i}`, scopes: ['read'] })).token.id);
  tokenSecrets = {
    ingest: (await svc.create(actor, { name: 'ingest', scopes: ['ingest'] })).secret,
    releases: (await svc.create(actor, { name: 'releases', scopes: ['releases'] })).secret,
    read: (await svc.create(actor, { name: 'read', scopes: ['read'] })).secret,
  };
});
afterAll(() => t.close());

function send(agent: ReturnType<typeof request.agent> | ReturnType<typeof request>, rc: RouteCase, headers: Record<string, string>) {
  let req = (agent as ReturnType<typeof request>)[rc.method](rc.path());
  for (const [k, v] of Object.entries(headers)) req = req.set(k, v);
  return rc.body ? req.send(rc.body()) : req;
}

describe.each(ROUTES)('$method $path', (rc) => {
  it('refuses anonymous callers with 401', async () => {
    const res = await send(request(t.app), rc, {});
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthorized');
  });

  it.each(ROLES)('role %s', async (role) => {
    const s = sessions[role];
    const res = await send(s.agent, rc, { 'x-csrf-token': s.csrf });
    const allowed = rc.roles === 'any' || rc.roles.includes(role);
    if (allowed) expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    else {
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
  });

  it.each(['ingest', 'releases', 'read'] as const)('token with scope %s', async (scope) => {
    const res = await send(request(t.app), rc, { authorization: `Bearer ${tokenSecrets[scope]}` });
    if (rc.scopes.includes(scope)) expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    else expect(res.status).toBe(403);
  });
});
