// Webhooks are posted from inside the network, so they obey the same target rules as probes and
// collection targets (Settings → Target rules; DESIGN.md §7): link-local and cloud metadata
// addresses refused unless an admin allows them, loopback only when the rules allow it.
import dns from 'node:dns/promises';
import net from 'node:net';
import type { Knex } from 'knex';
import { probeSettingsService } from '../../server/services/probe-settings';
import { createTargetGuard } from '../prober/target-guard';

/** A delivery that must not be retried: the target is refused by the rules, not down. */
export class RefusedTargetError extends Error {}

export async function assertWebhookTarget(db: Knex, url: string): Promise<void> {
  const guard = createTargetGuard(await probeSettingsService(db).targetPolicy());
  const host = new URL(url).hostname.replace(/^\[|\]$/g, '');
  let addresses: string[];
  try {
    addresses = net.isIP(host) ? [host] : (await dns.lookup(host, { all: true })).map((a) => a.address);
  } catch (e) {
    // Not resolvable now may be a passing DNS fault: an ordinary failure, retried.
    throw new Error(`webhook host ${host} does not resolve: ${(e as Error).message}`);
  }
  for (const address of addresses) {
    const verdict = guard.check(address);
    if (!verdict.allowed) throw new RefusedTargetError(`webhook to ${host} refused: ${verdict.reason} (Settings → Target rules)`);
  }
}
