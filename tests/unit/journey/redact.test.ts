import { Buffer } from 'node:buffer';
import { describe, expect, it } from 'vitest';
import { redactSecrets, secretForms } from '../../../shared/journey/redact';

const secrets = { API_TOKEN: 'tok/en+42 ok', PASSWORD: 'hunter2-horse' };

describe('secret redaction', () => {
  it('replaces the plain value', () => {
    expect(redactSecrets('token=tok/en+42 ok;', secrets)).toBe('token=[secret:API_TOKEN];');
  });

  it('replaces URL-encoded forms (%20 and + for spaces)', () => {
    const encoded = encodeURIComponent('tok/en+42 ok');
    expect(redactSecrets(`?t=${encoded}`, secrets)).toBe('?t=[secret:API_TOKEN]');
    expect(redactSecrets(`?t=${encoded.replace(/%20/g, '+')}`, secrets)).toBe('?t=[secret:API_TOKEN]');
  });

  it('replaces the forms a URL gives a raw value in its query or path', () => {
    const url = new URL(`https://shop.example/a/tok/en+42 ok?t=tok/en+42 ok`);
    expect(url.href).toBe('https://shop.example/a/tok/en+42%20ok?t=tok/en+42%20ok');
    expect(redactSecrets(url.href, secrets)).toBe('https://shop.example/a/[secret:API_TOKEN]?t=[secret:API_TOKEN]');
    expect(redactSecrets(encodeURI('x tok/en+42 ok'), secrets)).toBe('x%20[secret:API_TOKEN]');
  });

  it('replaces base64 forms, also inside a larger base64 string (Basic auth)', () => {
    const plain = Buffer.from('hunter2-horse').toString('base64');
    expect(redactSecrets(`x ${plain} y`, secrets)).not.toContain(plain.slice(0, 16));
    for (const user of ['a', 'ab', 'abc', 'wren']) {
      const basic = Buffer.from(`${user}:hunter2-horse`).toString('base64');
      const out = redactSecrets(`Authorization: Basic ${basic}`, secrets);
      expect(out, user).toContain('[secret:PASSWORD]');
      // What is left can no longer be decoded back to the password.
      const leftover = out.replace('Authorization: Basic ', '').replace('[secret:PASSWORD]', '');
      expect(Buffer.from(leftover, 'base64').toString('latin1')).not.toContain('hunter');
    }
    const urlSafe = Buffer.from('tok/en+42 ok??>>').toString('base64url');
    expect(redactSecrets(urlSafe, secrets)).toContain('[secret:API_TOKEN]');
  });

  it('replaces the JSON-escaped form', () => {
    const s = { Q: 'say "hi"\\now' };
    expect(redactSecrets(JSON.stringify({ v: s.Q }), s)).toBe('{"v":"[secret:Q]"}');
  });

  it('never rewrites a mark it has just written', () => {
    expect(redactSecrets('secret here', { secret: 'secret' })).toBe('[secret:secret] here');
    expect(redactSecrets('abcabc', { A: 'abc', B: 'abcabc' })).toBe('[secret:B]');
  });

  it('ignores empty values', () => {
    expect(secretForms('')).toEqual([]);
    expect(redactSecrets('unchanged', { EMPTY: '' })).toBe('unchanged');
  });
});
