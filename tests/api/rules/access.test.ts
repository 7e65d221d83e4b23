// Every alerting route × every role, anonymous callers and API tokens (DESIGN.md §2): everyone
// reads (and read tokens), engineers and admins write, only admins read the outgoing mail.
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../../shared/roles';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';
import { makeToken, samples, store, T0, thresholdDraft } from './seed';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';
interface RouteCase {
  method: Method;
  path: () => string;
  body?: () => object;
  roles: Role[] | 'any';
  /** Token scopes allowed (only read ever is). */
  read: boolean;
}

const WRITERS: Role[] = ['engineer', 'admin'];
const unique = () => crypto.randomBytes(4).toString('hex');

let t: TestApp;
const sessions = {} as Record<Role, SignedIn>;
const tokens = {} as Record<'ingest' | 'releases' | 'read', string>;
let ruleId: number;
let alertId: number;
let windowId: number;
let channelId: number;
const spare = { rules: [] as number[], windows: [] as number[], channels: [] as number[] };

const windowBody = () => ({ service: 'checkout', startsAt: new Date(T0).toISOString(), endsAt: new Date(T0 + 3_600_000).toISOString(), reason: 'patching' });

const ROUTES: RouteCase[] = [
  { method: 'get', path: () => '/api/rules', roles: 'any', read: true },
  { method: 'get', path: () => `/api/rules/${ruleId}`, roles: 'any', read: true },
  { method: 'post', path: () => '/api/rules', body: () => thresholdDraft({ name: `r-${unique()}` }), roles: WRITERS, read: false },
  { method: 'post', path: () => '/api/rules/replay', body: () => ({ rule: thresholdDraft(), from: T0, to: T0 + 3_600_000 }), roles: WRITERS, read: false },
  { method: 'put', path: () => `/api/rules/${ruleId}`, body: () => thresholdDraft(), roles: WRITERS, read: false },
  { method: 'post', path: () => `/api/rules/${ruleId}/disable`, roles: WRITERS, read: false },
  { method: 'post', path: () => `/api/rules/${ruleId}/enable`, roles: WRITERS, read: false },
  { method: 'post', path: () => `/api/rules/${ruleId}/duplicate`, roles: WRITERS, read: false },
  { method: 'delete', path: () => `/api/rules/${spare.rules.pop()}`, roles: WRITERS, read: false },
  { method: 'get', path: () => '/api/alerts', roles: 'any', read: true },
  { method: 'get', path: () => `/api/alerts/${alertId}`, roles: 'any', read: true },
  { method: 'get', path: () => '/api/maintenance-windows', roles: 'any', read: true },
  { method: 'get', path: () => `/api/maintenance-windows/${windowId}`, roles: 'any', read: true },
  { method: 'post', path: () => '/api/maintenance-windows', body: windowBody, roles: WRITERS, read: false },
  { method: 'patch', path: () => `/api/maintenance-windows/${windowId}`, body: () => ({ reason: `r-${unique()}` }), roles: WRITERS, read: false },
  { method: 'delete', path: () => `/api/maintenance-windows/${spare.windows.pop()}`, roles: WRITERS, read: false },
  { method: 'get', path: () => '/api/channels', roles: 'any', read: true },
  { method: 'get', path: () => `/api/channels/${channelId}`, roles: 'any', read: true },
  { method: 'post', path: () => '/api/channels', body: () => ({ name: `c-${unique()}`, url: 'https://hooks.example.test/x' }), roles: WRITERS, read: false },
  { method: 'patch', path: () => `/api/channels/${channelId}`, body: () => ({ enabled: true }), roles: WRITERS, read: false },
  { method: 'delete', path: () => `/api/channels/${spare.channels.pop()}`, roles: WRITERS, read: false },
  { method: 'get', path: () => '/api/outgoing-mail', roles: ['admin'], read: false },
];

beforeAll(async () => {
  process.env.PARALLAX_MAIL_DIR = fs.mkdtempSync(path.join(os.tmpdir(), 'px-mail-empty-'));
  t = await buildTestApp();
  for (const role of ROLES) sessions[role] = await signIn(t, (await addPerson(t, role)).email);
  for (const scope of ['ingest', 'releases', 'read'] as const) tokens[scope] = await makeToken(t, [scope]);
  await store(t.db.knex, samples('checkout', 'disk_free', 'gauge', { host: 'h1' }, T0, T0 + 600_000, () => 50));
  const eng = sessions.engineer;
  const make = async (p: string, body: object) => {
    const res = await eng.agent.post(p).set('x-csrf-token', eng.csrf).send(body);
    if (res.status !== 201) throw new Error(`${p}: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body.id as number;
  };
  ruleId = await make('/api/rules', thresholdDraft());
  windowId = await make('/api/maintenance-windows', windowBody());
  channelId = await make('/api/channels', { name: 'main', url: 'https://hooks.example.test/main' });
  for (let i = 0; i < 3; i++) {
    spare.rules.push(await make('/api/rules', thresholdDraft({ name: `spare ${i}` })));
    spare.windows.push(await make('/api/maintenance-windows', windowBody()));
    spare.channels.push(await make('/api/channels', { name: `spare-${i}`, url: 'https://hooks.example.test/spare' }));
  }
  alertId = (await t.db.knex('alerts').insert({ rule_id: ruleId, group_key: '[]', state: 'raised', opened_at: new Date(T0), raised_at: new Date(T0) }).returning('id'))[0].id;
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
  });

  it.each(ROLES)('role %s', async (role) => {
    const s = sessions[role];
    const res = await send(s.agent, rc, { 'x-csrf-token': s.csrf });
    if (rc.roles === 'any' || rc.roles.includes(role)) expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    else {
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
  });

  it.each(['ingest', 'releases', 'read'] as const)('token with scope %s', async (scope) => {
    const res = await send(request(t.app), rc, { authorization: `Bearer ${tokens[scope]}` });
    if (rc.read && scope === 'read') expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    else expect(res.status).toBe(403);
  });
});
