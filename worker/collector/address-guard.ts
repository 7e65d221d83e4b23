// Collection targets are fetched from inside the network, so the addresses that hand out
// credentials or reach the host itself are refused (DESIGN.md §7): link-local (cloud metadata
// lives at 169.254.169.254 and fd00:ec2::254) and unspecified addresses. Loopback stays allowed:
// collecting from a service on the same machine is an ordinary use.
import dns from 'node:dns/promises';
import net from 'node:net';

function refused(address: string): boolean {
  if (net.isIPv4(address)) {
    const [a, b] = address.split('.').map(Number) as [number, number];
    return a === 0 || (a === 169 && b === 254);
  }
  const v6 = address.toLowerCase();
  if (v6.startsWith('::ffff:')) return refused(v6.slice(7));
  return v6 === '::' || /^fe[89ab]/.test(v6) || v6 === 'fd00:ec2::254';
}

/** Throws when the URL's host is or resolves to a refused address. */
export async function assertCollectable(url: string): Promise<void> {
  const host = new URL(url).hostname.replace(/^\[|\]$/g, '');
  const addresses = net.isIP(host) ? [host] : (await dns.lookup(host, { all: true })).map((a) => a.address);
  const bad = addresses.find(refused);
  if (bad) throw new Error(`${host} resolves to ${bad}, a link-local or unspecified address that collection may not reach`);
}
