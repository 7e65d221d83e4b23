import { describe, expect, it } from 'vitest';
import { createTargetGuard, normalizeAddress } from '../../../worker/prober/target-guard';

const refused = (policy: object, address: string) => {
  const verdict = createTargetGuard(policy).check(address);
  return verdict.allowed ? null : verdict.reason;
};

describe('target guard', () => {
  it('refuses link-local and cloud metadata addresses by default', () => {
    expect(refused({}, '169.254.169.254')).toMatch(/cloud metadata address/);
    expect(refused({}, 'fd00:ec2::254')).toMatch(/cloud metadata address/);
    expect(refused({}, '169.254.1.1')).toMatch(/link-local address/);
    expect(refused({}, 'fe80::1')).toMatch(/link-local address/);
    expect(refused({}, 'fe80::1%eth0')).toMatch(/link-local address/);
    expect(refused({ allowLinkLocal: true }, '169.254.169.254')).toBeNull();
  });

  it('refuses loopback unless allowed, and unspecified addresses always', () => {
    expect(refused({}, '127.0.0.1')).toMatch(/loopback/);
    expect(refused({}, '127.8.9.10')).toMatch(/loopback/);
    expect(refused({}, '::1')).toMatch(/loopback/);
    expect(refused({ allowLoopback: true }, '127.0.0.1')).toBeNull();
    expect(refused({ allowLoopback: true }, '0.0.0.0')).toMatch(/unspecified/);
    expect(refused({ allowLoopback: true }, '::')).toMatch(/unspecified/);
  });

  it('sees through IPv4-mapped IPv6 spellings', () => {
    expect(normalizeAddress('::ffff:169.254.169.254')).toEqual({ address: '169.254.169.254', family: 'ipv4' });
    expect(normalizeAddress('[::ffff:a9fe:a9fe]')).toEqual({ address: '169.254.169.254', family: 'ipv4' });
    expect(normalizeAddress('0:0:0:0:0:ffff:7f00:1')).toEqual({ address: '127.0.0.1', family: 'ipv4' });
    expect(refused({}, '::ffff:a9fe:a9fe')).toMatch(/169\.254\.169\.254 is a cloud metadata address/);
    expect(refused({}, '::ffff:127.0.0.1')).toMatch(/loopback/);
  });

  it('applies deny before everything and allow as an allow-list', () => {
    const policy = { allow: ['10.0.0.0/8', '2001:db8::/32', '192.0.2.7'], deny: ['10.9.0.0/16'], allowLoopback: true };
    expect(refused(policy, '10.1.2.3')).toBeNull();
    expect(refused(policy, '2001:db8::5')).toBeNull();
    expect(refused(policy, '192.0.2.7')).toBeNull();
    expect(refused(policy, '192.0.2.8')).toMatch(/outside the target rules allow list/);
    expect(refused(policy, '10.9.0.1')).toMatch(/deny list/);
    expect(refused({ deny: ['127.0.0.1'], allowLoopback: true }, '127.0.0.1')).toMatch(/deny list/);
    expect(refused({}, '93.184.215.14')).toBeNull();
  });

  it('rejects a policy that is not a valid set of ranges', () => {
    expect(() => createTargetGuard({ allow: ['10.0.0.0/33'] })).toThrow(/IP address or a CIDR range/);
    expect(refused({}, 'example.com')).toBe('example.com is not an IP address');
  });
});
