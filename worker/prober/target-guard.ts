import { BlockList, isIP } from 'node:net';
import { type TargetPolicyInput, targetPolicySchema } from '../../shared/journey/target-policy-schema';

/**
 * Decides whether the prober may connect to an address, by the target rules (see
 * shared/journey/target-policy-schema.ts for the order of the checks).
 */

/** Cloud instance metadata services: AWS/GCP/Azure/OCI, AWS over IPv6, AWS ECS tasks, Alibaba Cloud. */
export const METADATA_ADDRESSES = ['169.254.169.254', 'fd00:ec2::254', '169.254.170.2', '100.100.100.200'] as const;

export type GuardVerdict = { allowed: true; address: string } | { allowed: false; address: string; reason: string };

export interface TargetGuard {
  check(address: string): GuardVerdict;
}

type Family = 'ipv4' | 'ipv6';

/** `::ffff:169.254.169.254` (or `::ffff:a9fe:a9fe`) reaches the IPv4 address: check that one. */
export function normalizeAddress(address: string): { address: string; family: Family } | null {
  let a = address.replace(/^\[|\]$/g, '').replace(/%.*$/, '').toLowerCase();
  const mapped = /^(?:::|(?:0{1,4}:){5})ffff:(.+)$/.exec(a);
  if (mapped) {
    const hex = /^([0-9a-f]{1,4}):([0-9a-f]{1,4})$/.exec(mapped[1]);
    if (isIP(mapped[1]) === 4) a = mapped[1];
    else if (hex) {
      const high = parseInt(hex[1], 16);
      const low = parseInt(hex[2], 16);
      a = [high >> 8, high & 255, low >> 8, low & 255].join('.');
    }
  }
  const version = isIP(a);
  return version === 0 ? null : { address: a, family: version === 4 ? 'ipv4' : 'ipv6' };
}

function blockList(entries: readonly string[]): BlockList {
  const list = new BlockList();
  for (const entry of entries) {
    const [address, prefix] = entry.split('/');
    const normal = normalizeAddress(address);
    if (!normal) throw new Error(`not an IP address or CIDR range: ${entry}`);
    if (prefix === undefined) list.addAddress(normal.address, normal.family);
    else list.addSubnet(normal.address, Number(prefix), normal.family);
  }
  return list;
}

const LOOPBACK = blockList(['127.0.0.0/8', '::1/128']);
const LINK_LOCAL = blockList(['169.254.0.0/16', 'fe80::/10']);
const METADATA = blockList([...METADATA_ADDRESSES]);
const UNSPECIFIED = blockList(['0.0.0.0/8', '::/128']);

export function createTargetGuard(policyInput: TargetPolicyInput): TargetGuard {
  const policy = targetPolicySchema.parse(policyInput);
  const deny = blockList(policy.deny);
  const allow = blockList(policy.allow);
  return {
    check(raw) {
      const normal = normalizeAddress(raw);
      if (!normal) return { allowed: false, address: raw, reason: `${raw} is not an IP address` };
      const { address, family } = normal;
      const refuse = (reason: string): GuardVerdict => ({ allowed: false, address, reason: `${address} ${reason}` });
      if (deny.check(address, family)) return refuse('is in the target rules deny list');
      if (UNSPECIFIED.check(address, family)) return refuse('is an unspecified address');
      if (LOOPBACK.check(address, family) && !policy.allowLoopback) return refuse('is a loopback address (refused unless the target rules allow loopback)');
      if (METADATA.check(address, family) && !policy.allowLinkLocal) {
        return refuse('is a cloud metadata address (refused unless the target rules allow link-local addresses)');
      }
      if (LINK_LOCAL.check(address, family) && !policy.allowLinkLocal) {
        return refuse('is a link-local address (refused unless the target rules allow link-local addresses)');
      }
      if (policy.allow.length > 0 && !allow.check(address, family)) return refuse('is outside the target rules allow list');
      return { allowed: true, address };
    },
  };
}
