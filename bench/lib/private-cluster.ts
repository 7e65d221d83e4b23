// A throwaway PostgreSQL cluster of its own (scripts/db.sh with a temporary data directory and
// port), for the benchmark and for tests that stop and start the database (they must never stop
// the shared test cluster other test files use).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { dbSettings, repoRoot, type DbSettings } from '../../server/config';
import { createKnex, migrateLatest } from '../../server/db/knex';

export interface PrivateCluster {
  dataDir: string;
  port: number;
  env: NodeJS.ProcessEnv;
  settings(database: string): DbSettings;
  start(): void;
  stop(): void;
  /** Creates a database and applies every migration. */
  createMigratedDatabase(name: string): Promise<DbSettings>;
  /** Stops the cluster and deletes its files. */
  destroy(): void;
  /**
   * CPU time (user + system, ms) used so far by the server and its running processes (backends,
   * WAL writer, checkpointer), read from /proc; null where there is no /proc. On a shared machine
   * this moves far less with other people's load than wall-clock time.
   */
  cpuMs(): number | null;
}

// Linux reports times in clock ticks, 100 a second on every common platform.
const TICKS_PER_SECOND = 100;

/**
 * The parent pid, utime + stime (fields 14 and 15 of /proc/<pid>/stat) and cutime + cstime (16
 * and 17: children that exited, such as the backend of a psql session that ended), or null.
 */
function procStat(pid: string): { ppid: number; ticks: number; childTicks: number } | null {
  try {
    const text = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name (field 2) may hold spaces; everything after its closing parenthesis is plain.
    const f = text.slice(text.lastIndexOf(')') + 2).split(' ');
    return { ppid: Number(f[1]), ticks: Number(f[11]) + Number(f[12]), childTicks: Number(f[13]) + Number(f[14]) };
  } catch {
    return null;
  }
}

/** CPU ms of this process's finished children (psql run with execFileSync), or null. */
export function childrenCpuMs(): number | null {
  try {
    const text = fs.readFileSync('/proc/self/stat', 'utf8');
    const f = text.slice(text.lastIndexOf(')') + 2).split(' ');
    return ((Number(f[13]) + Number(f[14])) * 1000) / TICKS_PER_SECOND;
  } catch {
    return null;
  }
}

/**
 * A TCP port nobody listens on right now, so two runs at once (two people's suites on one
 * machine) do not start, stop or share each other's clusters.
 */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

export function privateCluster(opts: { port: number; mode?: 'normal' | 'test'; label?: string }): PrivateCluster {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), `parallax-${opts.label ?? 'private'}-`));
  // The server runs as the postgres user when we are root: it must be able to enter the directory.
  fs.chmodSync(dataDir, 0o755);
  const env = { ...process.env, PARALLAX_DATA_DIR: dataDir, PARALLAX_DB_PORT: String(opts.port), PARALLAX_DB_MODE: opts.mode ?? 'normal' };
  const script = path.join(repoRoot, 'scripts/db.sh');
  const run = (cmd: string) => execFileSync('bash', [script, cmd], { env, stdio: ['ignore', 'ignore', 'pipe'] });
  return {
    dataDir,
    port: opts.port,
    env,
    settings: (database) => dbSettings(env, database),
    start: () => run('start'),
    stop: () => run('stop'),
    async createMigratedDatabase(name) {
      const admin = createKnex(dbSettings(env, 'postgres'), { max: 1 });
      try {
        await admin.raw(`DROP DATABASE IF EXISTS ${name}`);
        await admin.raw(`CREATE DATABASE ${name}`);
      } finally {
        await admin.destroy();
      }
      const db = createKnex(dbSettings(env, name), { max: 1 });
      try {
        await migrateLatest(db);
      } finally {
        await db.destroy();
      }
      return dbSettings(env, name);
    },
    cpuMs() {
      const pgDirFile = path.join(dataDir, 'pg-dir');
      try {
        const pgDir = fs.readFileSync(pgDirFile, 'utf8').trim();
        const postmaster = fs.readFileSync(path.join(pgDir, 'postmaster.pid'), 'utf8').split('\n')[0]!.trim();
        let ticks = 0;
        for (const pid of fs.readdirSync('/proc')) {
          if (!/^\d+$/.test(pid)) continue;
          const st = procStat(pid);
          if (st && pid === postmaster) ticks += st.ticks + st.childTicks;
          else if (st && String(st.ppid) === postmaster) ticks += st.ticks;
        }
        return (ticks * 1000) / TICKS_PER_SECOND;
      } catch {
        return null;
      }
    },
    destroy() {
      try {
        run('stop');
      } catch {
        // already stopped
      }
      // db.sh may have put the cluster elsewhere (see its pg-dir file).
      const pgDirFile = path.join(dataDir, 'pg-dir');
      const pgDir = fs.existsSync(pgDirFile) ? fs.readFileSync(pgDirFile, 'utf8').trim() : '';
      if (pgDir && !pgDir.startsWith(dataDir) && pgDir.startsWith(os.tmpdir())) fs.rmSync(pgDir, { recursive: true, force: true });
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}
