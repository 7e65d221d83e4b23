// First-load JavaScript of the web build, gzip-compressed: the scripts index.html loads before
// anything lazy. Budget 500 KB (the Foundation issue). Builds the web app first when stale.
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { buildWeb } from '../scripts/build-web';

const dist = path.resolve(__dirname, '../dist');
const BUDGET = 500 * 1024;

export function firstLoadScripts(distDir: string): string[] {
  const html = fs.readFileSync(path.join(distDir, 'index.html'), 'utf8');
  return [...html.matchAll(/<script[^>]+src="([^"]+)"/g)].map((m) => path.join(distDir, m[1]!.replace(/^\//, '')));
}

function main() {
  buildWeb(false);
  let raw = 0;
  let gz = 0;
  for (const f of firstLoadScripts(dist)) {
    const buf = fs.readFileSync(f);
    raw += buf.length;
    gz += zlib.gzipSync(buf, { level: 9 }).length;
    console.log(`  ${path.relative(dist, f)}  ${(buf.length / 1024).toFixed(0)} KB raw`);
  }
  const lazy = fs
    .readdirSync(path.join(dist, '_expo/static/js/web'))
    .filter((f) => f.endsWith('.js'))
    .map((f) => path.join(dist, '_expo/static/js/web', f))
    .filter((f) => !firstLoadScripts(dist).includes(f));
  const lazyGz = lazy.reduce((s, f) => s + zlib.gzipSync(fs.readFileSync(f), { level: 9 }).length, 0);
  console.log(`first-load JS: ${(raw / 1024).toFixed(0)} KB raw, ${(gz / 1024).toFixed(0)} KB gzip`);
  console.log(`lazy chunks: ${lazy.length}, ${(lazyGz / 1024).toFixed(0)} KB gzip (loaded on demand)`);
  console.log(`ratio to the 500 KB gzip budget: ${(gz / BUDGET).toFixed(2)} (${gz <= BUDGET ? 'within' : 'OVER'} budget)`);
  if (gz > BUDGET) process.exitCode = 1;
}

if (require.main === module) main();
