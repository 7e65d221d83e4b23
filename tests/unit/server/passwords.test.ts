import crypto from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '../../../server/auth/passwords';

describe('password hashing', () => {
  it('verifies the right password and refuses others', async () => {
    const h = await hashPassword('tea for two, two for tea');
    expect(h).toMatch(/^scrypt\$32768\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
    expect(await verifyPassword('tea for two, two for tea', h)).toBe(true);
    expect(await verifyPassword('tea for two, two for tee', h)).toBe(false);
    expect(await hashPassword('same')).not.toBe(await hashPassword('same')); // salted
  });

  it('reads the stored parameters: RFC 7914 §12 test vector (scrypt, P="password", S="NaCl", N=1024, r=8, p=16)', async () => {
    // Derived key from RFC 7914 §12 (recalled from memory, and cross-checked below against node's own scrypt).
    const dk =
      'fdbabe1c9d3472007856e7190d01e9fe7c6ad7cbc8237830e77376634b3731622eaf30d92e22a3886ff109279d9830dac727afb94a83ee6d8360cbdfa2cc0640';
    expect(crypto.scryptSync('password', 'NaCl', 64, { N: 1024, r: 8, p: 16 }).toString('hex')).toBe(dk);
    const stored = ['scrypt', 1024, 8, 16, Buffer.from('NaCl').toString('base64'), Buffer.from(dk, 'hex').toString('base64')].join('$');
    expect(await verifyPassword('password', stored)).toBe(true);
    expect(await verifyPassword('Password', stored)).toBe(false);
  });

  it('refuses malformed stored values instead of throwing', async () => {
    expect(await verifyPassword('x', 'plain-text')).toBe(false);
    expect(await verifyPassword('x', 'bcrypt$1$2$3$4$5')).toBe(false);
  });
});
