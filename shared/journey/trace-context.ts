/**
 * W3C Trace Context (Recommendation, 2021), the `traceparent` header:
 *   version "-" trace-id "-" parent-id "-" trace-flags
 * 2 + 32 + 16 + 2 lowercase hex digits; all-zero ids are invalid; version ff is invalid. A future
 * version (neither 00 nor ff) is parsed by its first four fields and may carry more after a dash.
 */

export interface Traceparent {
  version: string;
  traceId: string;
  parentId: string;
  flags: string;
  sampled: boolean;
}

export type TraceparentParse = { ok: true; value: Traceparent } | { ok: false; reason: string };

const HEX = /^[0-9a-f]+$/;
const ZERO = /^0+$/;

export type RandomBytes = (length: number) => Uint8Array;

const cryptoRandomBytes: RandomBytes = (length) => crypto.getRandomValues(new Uint8Array(length));

function hex(bytes: Uint8Array): string {
  let out = '';
  for (const b of bytes) out += b.toString(16).padStart(2, '0');
  return out;
}

function nonZeroHex(length: number, random: RandomBytes): string {
  for (;;) {
    const value = hex(random(length));
    if (!ZERO.test(value)) return value;
  }
}

/** A fresh sampled `traceparent`: version 00, random trace and parent ids, flags 01. */
export function generateTraceparent(random: RandomBytes = cryptoRandomBytes): Traceparent & { header: string } {
  const traceId = nonZeroHex(16, random);
  const parentId = nonZeroHex(8, random);
  const value = { version: '00', traceId, parentId, flags: '01', sampled: true };
  return { ...value, header: formatTraceparent(value) };
}

export function formatTraceparent(value: Pick<Traceparent, 'version' | 'traceId' | 'parentId' | 'flags'>): string {
  return `${value.version}-${value.traceId}-${value.parentId}-${value.flags}`;
}

export function parseTraceparent(header: string): TraceparentParse {
  const fail = (reason: string): TraceparentParse => ({ ok: false, reason });
  const version = header.slice(0, 2);
  if (version.length !== 2 || !HEX.test(version)) return fail('version must be 2 lowercase hex digits');
  if (version === 'ff') return fail('version ff is invalid');
  if (version === '00' && header.length !== 55) return fail('a version 00 traceparent is exactly 55 characters');
  if (header.length < 55) return fail('a traceparent is at least 55 characters');
  if (header.length > 55 && header[55] !== '-') return fail('fields after trace-flags must follow a dash');
  const [, traceId, parentId, flags] = header.slice(0, 55).split('-');
  if (header[2] !== '-' || header[35] !== '-' || header[52] !== '-') return fail('fields must be separated by dashes');
  if (traceId.length !== 32 || !HEX.test(traceId)) return fail('trace-id must be 32 lowercase hex digits');
  if (ZERO.test(traceId)) return fail('trace-id must not be all zeros');
  if (parentId.length !== 16 || !HEX.test(parentId)) return fail('parent-id must be 16 lowercase hex digits');
  if (ZERO.test(parentId)) return fail('parent-id must not be all zeros');
  if (flags.length !== 2 || !HEX.test(flags)) return fail('trace-flags must be 2 lowercase hex digits');
  return { ok: true, value: { version, traceId, parentId, flags, sampled: (parseInt(flags, 16) & 1) === 1 } };
}
