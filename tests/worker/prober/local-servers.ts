// Local HTTP/HTTPS servers on 127.0.0.1 for the prober tests, and a self-signed certificate made
// with the openssl CLI.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { type IncomingHttpHeaders, type IncomingMessage, type ServerResponse, createServer } from 'node:http';
import { createServer as createHttpsServer } from 'node:https';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { JourneyDocumentInput } from '../../../shared/journey/journey-schema';
import type { StepInput } from '../../../shared/journey/step-schema';

export interface SeenRequest {
  method: string;
  url: string;
  headers: IncomingHttpHeaders;
  body: string;
}

export interface LocalServer {
  url: string;
  port: number;
  seen: SeenRequest[];
  close(): Promise<void>;
}

export type Handler = (req: IncomingMessage & { body: string }, res: ServerResponse) => void;

export async function startServer(handler: Handler, tls?: { key: Buffer; cert: Buffer }): Promise<LocalServer> {
  const seen: SeenRequest[] = [];
  const listener = (req: IncomingMessage, res: ServerResponse) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      seen.push({ method: req.method!, url: req.url!, headers: req.headers, body });
      handler(Object.assign(req, { body }), res);
    });
  };
  const server = tls ? createHttpsServer(tls, listener) : createServer(listener);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  return {
    url: `${tls ? 'https' : 'http'}://127.0.0.1:${port}`,
    port,
    seen,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

/** A port nothing listens on (bound, then released). */
export async function closedPort(): Promise<number> {
  const server = await startServer(() => undefined);
  await server.close();
  return server.port;
}

/** A self-signed certificate for the given DNS names and 127.0.0.1, from the openssl CLI. */
export function selfSignedCertificate(names: string[]): { key: Buffer; cert: Buffer } {
  const dir = mkdtempSync(path.join(tmpdir(), 'parallax-cert-'));
  try {
    const san = [...names.map((n) => `DNS:${n}`), 'IP:127.0.0.1'].join(',');
    execFileSync(
      'openssl',
      ['req', '-x509', '-newkey', 'rsa:2048', '-nodes', '-days', '1', '-subj', `/CN=${names[0]}`, '-addext', `subjectAltName=${san}`,
        '-keyout', path.join(dir, 'key.pem'), '-out', path.join(dir, 'cert.pem')],
      { stdio: 'ignore' },
    );
    return { key: readFileSync(path.join(dir, 'key.pem')), cert: readFileSync(path.join(dir, 'cert.pem')) };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export function journey(steps: StepInput[], extra: Partial<JourneyDocumentInput> = {}): JourneyDocumentInput {
  return { name: 'test journey', steps, schedule: { kind: 'interval', everySeconds: 60 }, vantages: ['test'], ...extra };
}

export function json(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  res.writeHead(status, { 'content-type': 'application/json', ...headers });
  res.end(JSON.stringify(body));
}
