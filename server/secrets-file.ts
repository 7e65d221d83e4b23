// Random values made once per data directory (session signing key), never hard-coded.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export function readOrCreateSecret(dir: string, name: string, bytes = 32): string {
  const file = path.join(dir, name);
  try {
    const v = fs.readFileSync(file, 'utf8').trim();
    if (v) return v;
  } catch {
    /* first start */
  }
  fs.mkdirSync(dir, { recursive: true });
  const v = crypto.randomBytes(bytes).toString('hex');
  fs.writeFileSync(file, v + '\n', { mode: 0o600, flag: 'w' });
  return v;
}
