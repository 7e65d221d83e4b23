import { promises as dns } from 'node:dns';
import { isIP, type Socket } from 'node:net';
import type { ConnectionOptions } from 'node:tls';
import { Agent, buildConnector, type Dispatcher } from 'undici';
import type { TargetPolicyInput } from '../../shared/journey/target-policy-schema';
import { createTargetGuard } from './target-guard';

/**
 * The prober's own undici Agent. Its connector resolves the name itself, checks every resolved
 * address against the target rules, then connects to a checked address (no second lookup that
 * could answer differently), and notes when DNS, TCP and TLS finished for each connection.
 */

export type ConnectPhase = 'dns' | 'connect' | 'tls' | 'timeout' | 'blocked';

/** A connection-level failure, tagged with the phase it happened in. */
export class ProbeConnectError extends Error {
  constructor(
    readonly phase: ConnectPhase,
    message: string,
    options?: { cause?: unknown },
  ) {
    super(message, options);
    this.name = 'ProbeConnectError';
  }
}

/** One connection the agent opened (or tried to). Times are from `now()` (monotonic ms). */
export interface ConnectionRecord {
  host: string;
  /** The address connected to (or the last one tried); null until resolved. */
  address: string | null;
  /** null for IP literals: there was no lookup. */
  dnsDoneAt: number | null;
  connectDoneAt: number | null;
  /** null for plain HTTP. */
  tlsDoneAt: number | null;
}

export type ResolvedAddress = { address: string; family: number };
export type Resolver = (hostname: string) => Promise<ResolvedAddress[]>;

export const systemResolver: Resolver = (hostname) => dns.lookup(hostname, { all: true, verbatim: true });

export interface ProbeAgentOptions {
  policy: TargetPolicyInput;
  /** Name resolution; defaults to the system resolver (getaddrinfo, so /etc/hosts applies). */
  resolve?: Resolver;
  /** Extra trust (a test CA) or other TLS settings for HTTPS targets. */
  tls?: Pick<ConnectionOptions, 'ca' | 'rejectUnauthorized'>;
  /** Upper bound for one TCP/TLS connect; a step's own timeout is usually shorter. */
  connectTimeoutMs?: number;
  now?: () => number;
}

export interface ProbeAgent {
  dispatcher: Dispatcher;
  /** Append-only log of the connections opened through this agent, oldest first. */
  connections: ConnectionRecord[];
  /** Ends every connection at once (the run is over). */
  close(): Promise<void>;
}

type ConnectorOptions = Parameters<buildConnector.connector>[0];
type ConnectorCallback = buildConnector.Callback;

export function createProbeAgent(options: ProbeAgentOptions): ProbeAgent {
  const guard = createTargetGuard(options.policy);
  const resolve = options.resolve ?? systemResolver;
  const now = options.now ?? (() => performance.now());
  const connections: ConnectionRecord[] = [];
  // No TLS session reuse: every run pays (and measures) a full handshake.
  const base = buildConnector({ maxCachedSessions: 0, timeout: options.connectTimeoutMs ?? 120_000, ...options.tls });

  function connect(opts: ConnectorOptions, callback: ConnectorCallback): void {
    const host = opts.hostname.replace(/^\[|\]$/g, '');
    const record: ConnectionRecord = { host, address: null, dnsDoneAt: null, connectDoneAt: null, tlsDoneAt: null };
    connections.push(record);
    const fail = (error: ProbeConnectError) => callback(error, null);

    const attempt = (addresses: string[], i: number): void => {
      record.address = addresses[i];
      const servername = opts.protocol === 'https:' && isIP(host) === 0 ? host : undefined;
      // The connector returns its socket (undici's types say void; lib/core/connect.js returns it).
      const socket = base({ ...opts, hostname: addresses[i], ...(servername ? { servername } : {}) }, (error, connected) => {
        if (!error) return callback(null, connected!);
        if (record.connectDoneAt === null && i + 1 < addresses.length) return attempt(addresses, i + 1);
        const code = (error as NodeJS.ErrnoException).code;
        const phase: ConnectPhase =
          code === 'UND_ERR_CONNECT_TIMEOUT' ? 'timeout' : record.connectDoneAt === null ? 'connect' : 'tls';
        fail(new ProbeConnectError(phase, `${phase === 'tls' ? 'TLS handshake with' : 'could not connect to'} ${host} (${addresses[i]}): ${error.message}`, { cause: error }));
      }) as unknown as Socket;
      socket.once('connect', () => {
        record.connectDoneAt = now();
      });
      socket.once('secureConnect', () => {
        record.tlsDoneAt = now();
      });
    };

    const checkThenConnect = (addresses: string[]): void => {
      // Every address must pass: a name that also points at a refused address is refused.
      for (const address of addresses) {
        const verdict = guard.check(address);
        if (!verdict.allowed) return fail(new ProbeConnectError('blocked', `refused to connect to ${host}: ${verdict.reason}`));
      }
      attempt(addresses, 0);
    };

    if (isIP(host) !== 0) return checkThenConnect([host]);
    resolve(host).then(
      (resolved) => {
        record.dnsDoneAt = now();
        if (resolved.length === 0) return fail(new ProbeConnectError('dns', `${host} did not resolve to any address`));
        checkThenConnect(resolved.map((r) => r.address));
      },
      (error: NodeJS.ErrnoException) =>
        fail(new ProbeConnectError('dns', `could not resolve ${host}: ${error.code ?? error.message}`, { cause: error })),
    );
  }

  const dispatcher = new Agent({ connect });
  // destroy, not close: close waits for a connect still in progress (a hung lookup, a silent
  // firewall) long after the step has timed out; the run is over, nothing is left to finish.
  return { dispatcher, connections, close: () => dispatcher.destroy() };
}
