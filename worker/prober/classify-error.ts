import type { FailureClass } from '../../shared/journey/run-result';
import { ProbeConnectError } from './probe-agent';

/**
 * Which failure class a thrown request error belongs to, or null when it is not the target's
 * doing (a bug, a bad argument): the caller turns those into a void run.
 */

const DNS_CODES = new Set(['ENOTFOUND', 'EAI_AGAIN', 'EAI_NONAME', 'EAI_FAIL', 'EAI_NODATA', 'ENODATA', 'ESERVFAIL']);
const CONNECT_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'EHOSTUNREACH', 'ENETUNREACH', 'EHOSTDOWN', 'EPIPE', 'ECONNABORTED',
  'UND_ERR_SOCKET', 'UND_ERR_CLOSED', 'UND_ERR_RES_CONTENT_LENGTH_MISMATCH',
]);
const TIMEOUT_CODES = new Set(['ETIMEDOUT', 'UND_ERR_CONNECT_TIMEOUT', 'UND_ERR_HEADERS_TIMEOUT', 'UND_ERR_BODY_TIMEOUT']);

function isTlsCode(code: string): boolean {
  return /^(ERR_TLS_|ERR_SSL_|CERT_|UNABLE_TO_)/.test(code) || code === 'DEPTH_ZERO_SELF_SIGNED_CERT' || code === 'SELF_SIGNED_CERT_IN_CHAIN';
}

export function classifyRequestError(error: unknown): FailureClass | null {
  for (let e: unknown = error, depth = 0; e instanceof Error && depth < 5; e = e.cause, depth++) {
    if (e instanceof ProbeConnectError) return e.phase;
    const code = (e as NodeJS.ErrnoException).code;
    if (typeof code !== 'string') continue;
    if (DNS_CODES.has(code)) return 'dns';
    if (TIMEOUT_CODES.has(code)) return 'timeout';
    if (isTlsCode(code)) return 'tls';
    // HPE_*: the HTTP parser gave up on what the target sent.
    if (CONNECT_CODES.has(code) || code.startsWith('HPE_')) return 'connect';
  }
  return null;
}
