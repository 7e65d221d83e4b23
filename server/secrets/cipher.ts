// AES-256-GCM for secret values. The key comes from PARALLAX_SECRET_KEY (64 hex characters) or
// is generated once into the data directory; it never enters the database.
import crypto from 'node:crypto';
import { dataDir } from '../config';
import { readOrCreateSecret } from '../secrets-file';

export interface Sealed {
  iv: Buffer;
  ciphertext: Buffer;
  tag: Buffer;
}

export function loadSecretKey(env: NodeJS.ProcessEnv = process.env): Buffer {
  const hex = env.PARALLAX_SECRET_KEY ?? readOrCreateSecret(dataDir(env), 'secret-key', 32);
  const key = Buffer.from(hex, 'hex');
  if (key.length !== 32) throw new Error('PARALLAX_SECRET_KEY must be 64 hex characters (32 bytes)');
  return key;
}

/** The secret's name is bound as additional data, so a sealed value cannot be moved to another name. */
export function seal(key: Buffer, name: string, value: string): Sealed {
  const iv = crypto.randomBytes(12);
  const c = crypto.createCipheriv('aes-256-gcm', key, iv);
  c.setAAD(Buffer.from(name));
  const ciphertext = Buffer.concat([c.update(value, 'utf8'), c.final()]);
  return { iv, ciphertext, tag: c.getAuthTag() };
}

export function open(key: Buffer, name: string, s: Sealed): string {
  const d = crypto.createDecipheriv('aes-256-gcm', key, s.iv);
  d.setAAD(Buffer.from(name));
  d.setAuthTag(s.tag);
  return Buffer.concat([d.update(s.ciphertext), d.final()]).toString('utf8');
}
