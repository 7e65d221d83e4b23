// `npm start`: the whole product on this machine. Starts the private PostgreSQL, migrates, makes
// the first admin on an empty database, builds the web app when stale, then runs the SMTP sink,
// the server and a worker as child processes. Ctrl-C stops them all (and the database, if this
// command started it).
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { dataDir, dbPort, dbSettings, httpPort } from '../server/config';
import { createKnex } from '../server/db/knex';
import { usersService } from '../server/services/users';
import { loadSecretKey } from '../server/secrets/cipher';
import { demoIngestToken, seedDemo, seedDemoRules } from './seed-demo';
import { buildWeb } from './build-web';
import { migrate } from './migrate';

const root = path.resolve(__dirname, '..');
const env = {
  ...process.env,
  PARALLAX_DATA_DIR: dataDir(),
  PARALLAX_DB_PORT: String(dbPort()),
  // Links in mail point at this server unless a public address is configured.
  PARALLAX_PUBLIC_URL: process.env.PARALLAX_PUBLIC_URL ?? `http://127.0.0.1:${httpPort()}`,
};
const smtpPort = Number(process.env.PARALLAX_SMTP_PORT ?? 2525);
const demoPort = Number(process.env.PARALLAX_DEMO_PORT ?? 8090);
const vantage = process.env.PARALLAX_VANTAGE ?? 'local';

function db(cmd: 'start' | 'stop' | 'status'): boolean {
  try {
    execFileSync('bash', [path.join(root, 'scripts/db.sh'), cmd], { env, stdio: ['ignore', 'pipe', 'inherit'] });
    return true;
  } catch {
    return false;
  }
}

const children: { name: string; proc: ChildProcess }[] = [];
let stopping = false;
let startedDb = false;

function run(name: string, file: string, extraEnv: Record<string, string> = {}) {
  const proc = spawn(process.execPath, ['--import', 'tsx', path.join(root, file)], {
    cwd: root,
    env: { ...env, ...extraEnv },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  proc.on('exit', (code, signal) => {
    if (!stopping) {
      console.error(`[start] ${name} exited (${signal ?? code}); stopping everything`);
      void shutdown(1);
    }
  });
  children.push({ name, proc });
}

async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  console.log('\n[start] stopping…');
  await Promise.all(
    children.map(
      ({ proc }) =>
        new Promise<void>((resolve) => {
          if (proc.exitCode !== null || proc.signalCode !== null) return resolve();
          const kill = setTimeout(() => proc.kill('SIGKILL'), 8000);
          proc.once('exit', () => {
            clearTimeout(kill);
            resolve();
          });
          proc.kill('SIGTERM');
        }),
    ),
  );
  if (startedDb) db('stop');
  console.log('[start] stopped');
  process.exit(code);
}

async function main() {
  const wasRunning = db('status');
  if (!db('start')) throw new Error('the database did not start (see the lines above)');
  startedDb = !wasRunning;
  process.once('SIGINT', () => void shutdown(0));
  process.once('SIGTERM', () => void shutdown(0));

  const applied = await migrate(env);
  if (applied.length) console.log(`[db] applied ${applied.length} migration(s)`);

  const knex = createKnex(dbSettings(env), { max: 2 });
  let firstRun: { email: string; password: string } | null = null;
  let seeded = false;
  let ingestToken = '';
  try {
    firstRun = await usersService(knex).bootstrapAdmin({
      email: process.env.PARALLAX_ADMIN_EMAIL,
      password: process.env.PARALLAX_ADMIN_PASSWORD,
    });
    if (process.env.PARALLAX_DEMO !== '0') {
      seeded = await seedDemo(knex, { targetUrl: `http://127.0.0.1:${demoPort}`, vantage, secretKey: loadSecretKey(env) });
      ingestToken = await demoIngestToken(knex, dataDir());
    }
  } finally {
    await knex.destroy();
  }

  buildWeb(false);

  run('mail sink', 'scripts/smtp-sink.ts', { PARALLAX_SMTP_PORT: String(smtpPort) });
  if (process.env.PARALLAX_DEMO !== '0') {
    run('demo shop', 'scripts/demo.ts', {
      DEMO_TARGET_PORT: String(demoPort),
      PARALLAX_DEMO_OTLP_URL: `http://127.0.0.1:${httpPort()}/v1/metrics`,
      PARALLAX_DEMO_INGEST_TOKEN: ingestToken,
    });
  }
  run('server', 'server/main.ts', { PARALLAX_SMTP_PORT: String(smtpPort) });
  run('worker', 'worker/main.ts', { PARALLAX_VANTAGE: vantage, PARALLAX_SMTP_PORT: String(smtpPort) });

  const url = `http://127.0.0.1:${httpPort()}`;
  const lines = [
    '',
    `  Parallax is starting at ${url}`,
    `  data: ${dataDir()}   database: 127.0.0.1:${dbPort()}   mail sink: 127.0.0.1:${smtpPort}`,
  ];
  if (process.env.PARALLAX_DEMO !== '0') {
    lines.push(`  demo target (Quillmoor Tea Company, invented): http://127.0.0.1:${demoPort}, failure switches at http://127.0.0.1:${demoPort + 1}/control`);
  }
  if (seeded) lines.push('  Demo journeys "Find a tea" and "Buy a tea" were added; their first runs arrive within a minute.');
  if (firstRun) {
    lines.push(
      '',
      '  First run: an admin was created. These credentials are shown only now:',
      `    email:    ${firstRun.email}`,
      `    password: ${process.env.PARALLAX_ADMIN_PASSWORD ? '(from PARALLAX_ADMIN_PASSWORD)' : firstRun.password}`,
    );
  }
  lines.push('', '  Press Ctrl-C to stop.', '');
  console.log(lines.join('\n'));
  if (process.env.PARALLAX_DEMO !== '0') void seedRulesWhenSignalsArrive();
}

/** The demo's alert rules need the shop's signals, which arrive with its first metrics export. */
async function seedRulesWhenSignalsArrive() {
  const knex = createKnex(dbSettings(env), { max: 1 });
  try {
    for (let i = 0; i < 60 && !stopping; i++) {
      if (await seedDemoRules(knex)) return;
      await new Promise((r) => setTimeout(r, 5000));
    }
  } catch (e) {
    console.error(`[start] demo alert rules not added: ${(e as Error).message}`);
  } finally {
    await knex.destroy();
  }
}

main().catch(async (e: Error) => {
  console.error(`[start] ${e.message}`);
  await shutdown(1);
});
