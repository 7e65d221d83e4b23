// The real server (real web build, real database) listening on a free loopback port.
import crypto from 'node:crypto';
import http from 'node:http';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../server/app';
import { usersService } from '../../server/services/users';
import { buildWeb } from '../../scripts/build-web';
import { createTestDb, pgPool, type TestDb } from './db';

export interface LiveServer {
  url: string;
  db: TestDb;
  admin: { email: string; password: string };
  close(): Promise<void>;
}

export async function startLiveServer(): Promise<LiveServer> {
  buildWeb(false);
  const db = await createTestDb();
  const pool = pgPool(db.settings);
  const admin = (await usersService(db.knex).bootstrapAdmin({}))!;
  const app = createApp({
    db: db.knex,
    sessionPool: pool,
    sessionSecret: crypto.randomBytes(32).toString('hex'),
    secretKey: crypto.randomBytes(32),
    webDir: path.resolve(__dirname, '../../dist'),
    log: () => {},
  });
  const server = http.createServer(app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    db,
    admin,
    async close() {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      await pool.end();
      await db.drop();
    },
  };
}
