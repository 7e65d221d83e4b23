// multer with a storage engine that hands the uploaded file's stream to a handler instead of
// buffering it, so a large CSV is parsed and stored while it arrives.
import type { Readable } from 'node:stream';
import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import { AppError, ValidationError } from '../../errors';

export const CSV_MAX_BYTES = Number(process.env.PARALLAX_CSV_MAX_BYTES ?? 100 * 1024 * 1024);

const results = new WeakMap<Request, unknown>();

/** What the handler returned for this request's file (undefined: no file was sent). */
export function uploadResult<T>(req: Request): T | undefined {
  return results.get(req) as T | undefined;
}

export function streamingUpload(field: string, handle: (req: Request, file: Readable, name: string) => Promise<unknown>, maxBytes = CSV_MAX_BYTES): RequestHandler {
  const storage: multer.StorageEngine = {
    _handleFile(req, file, cb) {
      handle(req, file.stream, file.originalname).then(
        (value) => {
          results.set(req, value);
          // The handler may stop early (a preview): read the rest into nothing so the form completes.
          file.stream.resume();
          file.stream.once('end', () => cb(null, {}));
          if (file.stream.readableEnded) cb(null, {});
        },
        (err) => {
          file.stream.resume();
          cb(err);
        },
      );
    },
    _removeFile(_req, _file, cb) {
      cb(null);
    },
  };
  const upload = multer({ storage, limits: { fileSize: maxBytes, files: 1, fields: 10, fieldSize: 64 * 1024 } }).single(field);
  return (req, res, next) => {
    upload(req, res, (err?: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE')
          return next(new AppError(413, 'payload_too_large', `The file is larger than ${Math.round(maxBytes / 1048576)} MiB; rows before the limit were stored, split the file and upload the rest`));
        return next(new ValidationError(`${err.message}${err.field ? ` (${err.field})` : ''}`, err.field ?? field));
      }
      if (err instanceof AppError) return next(err);
      if (err instanceof Error && /Unexpected end of form|Multipart: Boundary not found|Malformed part header/i.test(err.message))
        return next(new ValidationError(`The upload is not a valid multipart form: ${err.message}`, field));
      next(err);
    });
  };
}
