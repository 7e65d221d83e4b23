// Collection targets are fetched from inside the network, so they obey the same target rules as
// probes (Settings → Target rules; DESIGN.md §7): link-local and cloud metadata addresses are
// refused unless an admin allows them, loopback only when the rules allow it, deny lists apply.
import dns from 'node:dns/promises';
import net from 'node:net';
import type { Knex } from 'knex';
import { probeSettingsService } from '../../server/services/probe-settings';
import { createTargetGuard } from '../prober/target-guard';

/** Throws when the URL's host is, or resolves to, an address the target rules refuse. */
export async function assertCollectable(db: Knex, url: string): Promise<void> {
  const guard = createTargetGuard(await probeSettingsService(db).targetPolicy());
  const host = new URL(url).hostname.replace(/^\[|\]$/g, '');
  const addresses = net.isIP(host) ? [host] : (await dns.lookup(host, { all: true })).map((a) => a.address);
  for (const address of addresses) {
    const verdict = guard.check(address);
    if (!verdict.allowed) throw new Error(`collection from ${host} refused: ${verdict.reason} (Settings → Target rules)`);
  }
}
