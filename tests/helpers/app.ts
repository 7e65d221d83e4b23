// An app on its own test database, plus helpers to sign people in through the real API.
import crypto from 'node:crypto';
import type { Express } from 'express';
import type pg from 'pg';
import request from 'supertest';
import type { Role } from '../../shared/roles';
import type PgBoss from 'pg-boss';
import { createApp, type AppDeps } from '../../server/app';
import { startBoss } from '../../worker/boss';
import { hashPassword } from '../../server/auth/passwords';
import { usersRepo } from '../../server/repositories/users';
import { createTestDb, pgPool, type TestDb } from './db';

export interface TestApp {
  app: Express;
  db: TestDb;
  pool: pg.Pool;
  /** With { withQueue: true }: the app's pg-boss (send side), also usable by the test's workers. */
  boss?: PgBoss;
  close(): Promise<void>;
}

export async function buildTestApp(overrides: Partial<AppDeps> & { withQueue?: boolean } = {}): Promise<TestApp> {
  const { withQueue, ...deps } = overrides;
  const db = await createTestDb();
  const pool = pgPool(db.settings);
  const boss = withQueue ? await startBoss(db.settings) : undefined;
  const app = createApp({
    boss,
    db: db.knex,
    sessionPool: pool,
    sessionSecret: crypto.randomBytes(32).toString('hex'),
    secretKey: crypto.randomBytes(32),
    log: () => {},
    ...deps,
  });
  return {
    app,
    db,
    pool,
    boss,
    async close() {
      await boss?.stop({ graceful: false, wait: true });
      await pool.end();
      await db.drop();
    },
  };
}

// One hash for every test person: scrypt is deliberately slow.
let sharedHash: Promise<string> | null = null;
export const TEST_PASSWORD = 'correct horse battery staple';

export async function addPerson(t: TestApp, role: Role, email = `${role}-${crypto.randomBytes(3).toString('hex')}@example.test`) {
  sharedHash ??= hashPassword(TEST_PASSWORD);
  return usersRepo.insert(t.db.knex, { email, name: `Test ${role}`, role, passwordHash: await sharedHash });
}

export interface SignedIn {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
}

export async function signIn(t: TestApp, email: string, password = TEST_PASSWORD): Promise<SignedIn> {
  const agent = request.agent(t.app);
  const s = await agent.get('/api/auth/session').expect(200);
  const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', s.body.csrfToken).send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, csrf: res.body.csrfToken };
}
