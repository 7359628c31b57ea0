import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError } from '../errors/app-error';
import { createUploadStorage, removeFileIfPresent } from '../services/log-storage.service';

/** Where a log upload may be read from: the data folder and the size limit. */
export interface LogUploadSettings {
  /** The data folder (files are received into `uploads/tmp` under it). */
  dataDir: string;
  /** The largest file accepted, in bytes. */
  maxUploadBytes: number;
}

/** Multer's error codes that mean "too large"; any other multer refusal is bad input. */
const TOO_LARGE_CODES: ReadonlySet<string> = new Set(['LIMIT_FILE_SIZE']);

/** Turns multer's refusals into the API's error answers (413 too large, else 400). */
function toUploadError(err: unknown, maxUploadBytes: number): unknown {
  if (!(err instanceof multer.MulterError)) return err;
  if (TOO_LARGE_CODES.has(err.code)) {
    return new AppError(413, 'too_large', 'The file is larger than the server accepts', {
      maxBytes: maxUploadBytes,
    });
  }
  const path = err.field ? `body.${err.field}` : 'body';
  return new AppError(400, 'invalid_input', `Invalid ${path}: ${err.message}`, {
    issues: [{ path, message: err.message }],
  });
}

/**
 * Reads a multipart log upload: the `file` part streamed (hashed, counted, gzip-compressed) into
 * the temporary folder, the text fields into `req.body`. Whatever happens next, the temporary
 * file is removed when the response is done, unless the service has moved it to keep it.
 */
export function receiveLogUpload(settings: LogUploadSettings): RequestHandler {
  const upload = multer({
    storage: createUploadStorage(settings.dataDir),
    limits: {
      fileSize: settings.maxUploadBytes,
      files: 1,
      fields: 8,
      fieldSize: 256 * 1024,
      parts: 10,
    },
  }).single('file');
  return (req, res, next) => {
    res.once('close', () => {
      if (req.file?.path) void removeFileIfPresent(req.file.path).catch(() => undefined);
    });
    upload(req, res, (err?: unknown) => {
      next(err === undefined ? undefined : toUploadError(err, settings.maxUploadBytes));
    });
  };
}
