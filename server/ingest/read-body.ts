// Reads a request body with a hard limit on both the bytes received and the bytes they inflate to,
// so neither a huge upload nor a small gzip bomb can make the server hold more than the limit.
import type { Request } from 'express';
import zlib from 'node:zlib';
import { AppError } from '../errors';

export class PayloadTooLargeError extends AppError {
  constructor(limit: number) {
    super(413, 'payload_too_large', `The request body is larger than ${Math.round(limit / 1048576)} MiB (after decompression)`);
  }
}

export class UnsupportedEncodingError extends AppError {
  constructor(encoding: string) {
    super(415, 'validation', `Content-Encoding ${encoding} is not supported; send identity or gzip`);
  }
}

/**
 * Resolves with the (decompressed) body. Over the limit it rejects with PayloadTooLargeError
 * and keeps reading the rest of the upload into nothing, so the client sees the 413 instead of a
 * reset connection.
 */
export function readBody(req: Request, limit: number): Promise<Buffer> {
  const encoding = (req.get('content-encoding') ?? 'identity').trim().toLowerCase();
  const declared = Number(req.get('content-length') ?? NaN);
  return new Promise<Buffer>((resolve, reject) => {
    let settled = false;
    const fail = (e: Error) => {
      if (settled) return;
      settled = true;
      req.unpipe();
      req.resume();
      reject(e);
    };
    if (Number.isFinite(declared) && declared > limit) return fail(new PayloadTooLargeError(limit));
    let source: NodeJS.ReadableStream = req;
    let inflater: zlib.Gunzip | zlib.Inflate | null = null;
    if (encoding === 'gzip' || encoding === 'x-gzip') inflater = zlib.createGunzip();
    else if (encoding === 'deflate') inflater = zlib.createInflate();
    else if (encoding !== 'identity') return fail(new UnsupportedEncodingError(encoding));

    let received = 0;
    req.on('data', (chunk: Buffer) => {
      received += chunk.length;
      if (received > limit) {
        inflater?.destroy();
        fail(new PayloadTooLargeError(limit));
      }
    });
    req.on('error', (e) => fail(e));
    if (inflater) {
      req.pipe(inflater);
      source = inflater;
      inflater.on('error', () => fail(new AppError(400, 'validation', `The body is not valid ${encoding} data`)));
    }
    const chunks: Buffer[] = [];
    let size = 0;
    source.on('data', (chunk: Buffer) => {
      if (settled) return;
      size += chunk.length;
      if (size > limit) {
        inflater?.destroy();
        return fail(new PayloadTooLargeError(limit));
      }
      chunks.push(chunk);
    });
    source.on('end', () => {
      if (settled) return;
      settled = true;
      resolve(Buffer.concat(chunks, size));
    });
  });
}
