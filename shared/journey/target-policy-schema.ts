import { z } from 'zod';

const addressOrRange = z.union([z.cidrv4(), z.cidrv6(), z.ipv4(), z.ipv6()], {
  error: 'use an IP address or a CIDR range such as 10.0.0.0/8 or fd00::/8',
});

/**
 * Which addresses the prober may connect to (DESIGN.md §7). Every address a target's name
 * resolves to is checked before connecting:
 * 1. inside a `deny` range → refused;
 * 2. loopback (127.0.0.0/8, ::1) → refused unless `allowLoopback`;
 * 3. link-local (169.254.0.0/16, fe80::/10) and cloud metadata addresses → refused unless
 *    `allowLinkLocal`; unspecified addresses (0.0.0.0/8, ::) → always refused;
 * 4. `allow` not empty and the address outside every range in it → refused;
 * 5. otherwise allowed.
 */
export const targetPolicySchema = z.object({
  allow: z.array(addressOrRange).max(500, 'at most 500 allow entries').default([]),
  deny: z.array(addressOrRange).max(500, 'at most 500 deny entries').default([]),
  allowLoopback: z.boolean({ error: 'allowLoopback must be true or false' }).default(false),
  allowLinkLocal: z.boolean({ error: 'allowLinkLocal must be true or false' }).default(false),
});
export type TargetPolicy = z.infer<typeof targetPolicySchema>;
export type TargetPolicyInput = z.input<typeof targetPolicySchema>;
