import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, rename, stat, unlink } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { Transform, type TransformCallback } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { createGunzip, createGzip } from 'node:zlib';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';
import { SNIFF_LENGTH } from '../../shared/import';

/**
 * How many bytes of a file's start are kept in memory for sniffing: enough for SNIFF_LENGTH
 * characters even when every one of them takes four UTF-8 bytes, so the server sees the same
 * head text the importer will.
 */
const HEAD_BYTES = SNIFF_LENGTH * 4;

/**
 * The fastest gzip level: the client waits for the whole file to be compressed before its 202.
 * On a 100 MB simulated log (2 cores): level 1 takes 0.47 s for a 5.1× smaller file, the default
 * level 6 takes 3.0 s for 6.7×.
 */
const GZIP = { level: 1 };

/** A file an upload carried, compressed into the temporary folder and not yet kept. */
export interface ReceivedFile {
  /** Absolute path of the gzip file in `uploads/tmp`. */
  readonly tmpPath: string;
  /** The name the client gave the file. */
  readonly fileName: string;
  /** Size of the file as sent (uncompressed), in bytes. */
  readonly sizeBytes: number;
  /** SHA-256 of the file as sent, hex. */
  readonly sha256: string;
  /** The first bytes of the file as sent (at most {@link HEAD_BYTES}). */
  readonly head: Buffer;
}

/** The folder uploads are received into before they are checked and kept. */
export function uploadTmpDir(dataDir: string): string {
  return join(dataDir, 'uploads', 'tmp');
}

/** Where a log's compressed raw file is kept, relative to the data folder. */
export function rawPathFor(shopId: string, logId: string): string {
  return join('uploads', shopId, `${logId}.csv.gz`);
}

/** Observes the bytes going by: SHA-256, count and the head, without changing them. */
class UploadTap extends Transform {
  readonly hash = createHash('sha256');
  sizeBytes = 0;
  private readonly headPieces: Buffer[] = [];
  private headLength = 0;

  override _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback): void {
    this.hash.update(chunk);
    this.sizeBytes += chunk.length;
    if (this.headLength < HEAD_BYTES) {
      const piece = chunk.subarray(0, HEAD_BYTES - this.headLength);
      this.headPieces.push(Buffer.from(piece));
      this.headLength += piece.length;
    }
    done(null, chunk);
  }

  /** The head bytes seen. */
  head(): Buffer {
    return Buffer.concat(this.headPieces, this.headLength);
  }
}

/** Removes a file; a file already gone is fine (it was kept elsewhere or never written). */
export async function removeFileIfPresent(path: string): Promise<void> {
  try {
    await unlink(path);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw err;
  }
}

/**
 * A multer storage engine that streams the file part through SHA-256, a byte count and gzip into
 * `uploads/tmp`, keeping only its head in memory: a file of any size costs a few hundred KiB.
 * Multer removes the temporary file itself when the size limit is passed or the client leaves.
 */
export function createUploadStorage(dataDir: string): StorageEngine {
  const tmpDir = uploadTmpDir(dataDir);
  return {
    _handleFile(_req: Request, file, callback): void {
      const tmpPath = join(tmpDir, `${randomBytes(16).toString('hex')}.csv.gz`);
      const tap = new UploadTap();
      // The path is known before writing so that an abort mid-way can remove the partial file.
      Object.assign(file, { path: tmpPath });
      mkdir(tmpDir, { recursive: true })
        .then(() => pipeline(file.stream, tap, createGzip(GZIP), createWriteStream(tmpPath)))
        .then(
          () => {
            // Multer copies these onto `req.file`; receivedFileOf reads them back, checked.
            const info: Partial<Express.Multer.File> & { sha256: string; head: Buffer } = {
              path: tmpPath,
              size: tap.sizeBytes,
              sha256: tap.hash.digest('hex'),
              head: tap.head(),
            };
            callback(null, info);
          },
          (err: unknown) => {
            void removeFileIfPresent(tmpPath).finally(() => callback(err as Error));
          },
        );
    },
    _removeFile(_req: Request, file, callback): void {
      removeFileIfPresent(file.path).then(
        () => callback(null),
        (err: unknown) => callback(err as Error),
      );
    },
  };
}

/** The file multer received through {@link createUploadStorage}, or null when there is none. */
export function receivedFileOf(file: Express.Multer.File | undefined): ReceivedFile | null {
  if (!file) return null;
  const extra = file as Express.Multer.File & { sha256?: unknown; head?: unknown };
  if (typeof extra.sha256 !== 'string' || !Buffer.isBuffer(extra.head)) return null;
  return {
    tmpPath: file.path,
    fileName: file.originalname || 'log.csv',
    sizeBytes: file.size,
    sha256: extra.sha256,
    head: extra.head,
  };
}

/** Moves a received file to its place under the data folder (same disk: an atomic rename). */
export async function keepReceivedFile(
  dataDir: string,
  file: ReceivedFile,
  rawPath: string,
): Promise<void> {
  const target = join(dataDir, rawPath);
  await mkdir(dirname(target), { recursive: true });
  await rename(file.tmpPath, target);
}

/** Removes a kept raw file (when the log it belongs to could not be stored). */
export function removeRawFile(dataDir: string, rawPath: string): Promise<void> {
  return removeFileIfPresent(join(dataDir, rawPath));
}

/** Whether a kept raw file is present under the data folder. */
export async function hasRawFile(dataDir: string, rawPath: string): Promise<boolean> {
  try {
    return (await stat(join(dataDir, rawPath))).isFile();
  } catch {
    return false;
  }
}

/** A kept raw file opened for reading as text, with how far into it the reading is. */
export interface RawTextReader {
  /** The file's text, decompressed, in pieces (UTF-8 characters are never split). */
  readonly pieces: AsyncIterable<string>;
  /** The share of the compressed file read so far, 0–1. */
  fraction(): number;
  /** Stops reading and releases the file. */
  close(): void;
}

/** Opens a kept raw file: reads `pieceBytes` of compressed data at a time and inflates it. */
export async function openRawText(
  dataDir: string,
  rawPath: string,
  pieceBytes: number,
): Promise<RawTextReader> {
  const path = join(dataDir, rawPath);
  const { size } = await stat(path);
  const file = createReadStream(path, { highWaterMark: pieceBytes });
  const gunzip = createGunzip({ chunkSize: Math.max(pieceBytes, 16 * 1024) });
  gunzip.setEncoding('utf8');
  file.on('error', (err) => gunzip.destroy(err));
  file.pipe(gunzip);
  return {
    pieces: gunzip as AsyncIterable<string>,
    fraction: () => (size > 0 ? Math.min(1, file.bytesRead / size) : 1),
    close: () => {
      file.destroy();
      gunzip.destroy();
    },
  };
}
