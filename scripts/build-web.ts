// Builds the web app (expo export) when the build is missing or older than its sources.
// `--force` always builds. Runs offline: no telemetry, no update checks.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(__dirname, '..');
const out = path.join(root, 'dist');
const SOURCES = ['app', 'components', 'hooks', 'shared', 'assets', 'app.json', 'metro.config.js', 'package-lock.json'];

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let m = 0;
  for (const e of fs.readdirSync(p)) m = Math.max(m, newestMtime(path.join(p, e)));
  return m;
}

export function webBuildIsStale(): boolean {
  const index = path.join(out, 'index.html');
  if (!fs.existsSync(index)) return true;
  const built = fs.statSync(index).mtimeMs;
  return SOURCES.some((s) => newestMtime(path.join(root, s)) > built);
}

export function buildWeb(force = false): void {
  if (!force && !webBuildIsStale()) {
    console.log('[web] build is up to date');
    return;
  }
  console.log('[web] building the web app (expo export; about a minute on a cold cache)');
  const t0 = Date.now();
  // Export beside the live build and swap it in at the end, so a server reading dist/ never sees
  // a half-written build and two builds at once cannot mix their files.
  const tmp = `${out}.build-${process.pid}`;
  fs.rmSync(tmp, { recursive: true, force: true });
  const r = spawnSync(
    process.execPath,
    [require.resolve('expo/bin/cli'), 'export', '--platform', 'web', '--output-dir', tmp],
    {
      cwd: root,
      stdio: ['ignore', 'pipe', 'pipe'],
      env: { ...process.env, EXPO_OFFLINE: '1', EXPO_NO_TELEMETRY: '1', CI: '1', NODE_ENV: 'production' },
      encoding: 'utf8',
      maxBuffer: 64 * 1024 * 1024,
    },
  );
  if (r.status !== 0) {
    process.stderr.write(r.stdout + r.stderr);
    fs.rmSync(tmp, { recursive: true, force: true });
    throw new Error('[web] expo export failed');
  }
  // Touch the index so the staleness check compares against this build's start time.
  const started = new Date(t0);
  fs.utimesSync(path.join(tmp, 'index.html'), started, started);
  const old = `${out}.old-${process.pid}`;
  if (fs.existsSync(out)) fs.renameSync(out, old);
  fs.renameSync(tmp, out);
  fs.rmSync(old, { recursive: true, force: true });
  console.log(`[web] built in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
}

if (require.main === module) {
  try {
    buildWeb(process.argv.includes('--force'));
  } catch (e) {
    console.error((e as Error).message);
    process.exit(1);
  }
}
