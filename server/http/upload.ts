// Multipart uploads through multer, one file in the field `file`, held in memory with a size cap
// that depends on the file: a storage engine that counts the bytes as they arrive and stops at the
// cap, so an oversized photo is refused after 15 MB rather than after the largest cap of any kind.
import multer, { type StorageEngine } from 'multer';
import type { Request, RequestHandler } from 'express';
import { AppError } from '../lib/app-error';

export interface UploadedFile {
  buffer: Buffer;
  size: number;
  originalname: string;
  mimetype: string;
}

export interface UploadOptions {
  /** The cap for this file in bytes, from its (client-given) name; throw an AppError to refuse it at once. */
  maxBytesFor(originalName: string): number;
  /** Upper bound for any file of this route (multer's own limit, a second line of defence). */
  absoluteMaxBytes: number;
  /** Text fields allowed beside the file (e.g. mapping, mode). */
  maxFields?: number;
  maxFieldBytes?: number;
}

export const tooLarge = (maxBytes: number) =>
  new AppError(413, 'file-too-large', `The file is larger than the ${formatBytes(maxBytes)} allowed for it.`, { maxBytes });

function cappedMemoryStorage(opts: UploadOptions): StorageEngine {
  return {
    _handleFile(_req, file, cb) {
      let max: number;
      try {
        max = opts.maxBytesFor(file.originalname);
      } catch (err) {
        file.stream.resume();
        return cb(err as Error);
      }
      const chunks: Buffer[] = [];
      let size = 0;
      let failed = false;
      file.stream.on('data', (chunk: Buffer) => {
        if (failed) return;
        size += chunk.length;
        if (size > max) {
          failed = true;
          chunks.length = 0;
          // Keep reading (and dropping) the rest so the client gets the answer instead of a reset.
          file.stream.resume();
          cb(tooLarge(max));
          return;
        }
        chunks.push(chunk);
      });
      file.stream.on('end', () => {
        if (failed) return;
        const buffer = Buffer.concat(chunks, size);
        cb(null, { buffer, size } as Partial<Express.Multer.File>);
      });
    },
    _removeFile(_req, file, cb) {
      (file as { buffer?: Buffer }).buffer = undefined;
      cb(null);
    },
  };
}

export function singleFileUpload(opts: UploadOptions): RequestHandler {
  const handler = multer({
    storage: cappedMemoryStorage(opts),
    // Browsers send the file name as raw UTF-8 in the part header.
    defParamCharset: 'utf8',
    limits: {
      fileSize: opts.absoluteMaxBytes,
      files: 1,
      fields: opts.maxFields ?? 4,
      fieldSize: opts.maxFieldBytes ?? 16 * 1024,
      parts: (opts.maxFields ?? 4) + 1,
      headerPairs: 100,
    },
  }).single('file');
  return (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      return next(new AppError(415, 'multipart-required', 'Send the file as multipart/form-data in a field named "file".'));
    }
    handler(req, res, (err?: unknown) => {
      const e = err as { code?: string; field?: string } | undefined;
      if (e?.code === 'LIMIT_UNEXPECTED_FILE') {
        return next(
          new AppError(422, 'unexpected-field', `Send the file in a field named "file" (not "${e.field}"), one file per request.`),
        );
      }
      if (e?.code === 'LIMIT_FILE_COUNT') return next(new AppError(422, 'one-file', 'Send one file per request.'));
      // busboy's own parse errors ("Malformed part header", "Unexpected end of form") carry no code.
      if (err && !(err instanceof AppError) && !e?.code) {
        return next(new AppError(400, 'malformed-multipart', `The upload could not be read (${(err as Error).message}); send it again.`));
      }
      next(err);
    });
  };
}

/** The file multer left on the request, or a 422 when none was sent. */
export function uploadedFile(req: Request): UploadedFile {
  const file = (req as Request & { file?: UploadedFile }).file;
  if (!file) throw new AppError(422, 'no-file', 'No file was sent: choose a file and send it in the field "file".');
  return file;
}

export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${Math.round((n / (1024 * 1024)) * 10) / 10} MB`;
  if (n >= 1024) return `${Math.round(n / 1024)} kB`;
  return `${n} bytes`;
}
