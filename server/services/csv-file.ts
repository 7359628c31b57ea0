import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import {
  createCsvImporter,
  type ColumnMapping,
  type CsvImportResult,
  type ParseCsvOptions,
} from '../../shared/import';

/** Options of `importCsvFile`. */
export interface ImportCsvFileOptions extends ParseCsvOptions {
  /** Called now and then with the share of the file read, 0–1. */
  readonly onProgress?: (fraction: number) => void;
  /** Size of each piece read from disk, bytes. Default 1 MiB. */
  readonly pieceBytes?: number;
}

/**
 * Imports a CSV file from disk piece by piece through the shared push-based importer: memory
 * holds the log being built and one piece of text, never the whole file. Rejects with the
 * importer's ImportError when the file cannot be used.
 */
export async function importCsvFile(
  path: string,
  mapping: ColumnMapping | undefined,
  options: ImportCsvFileOptions,
): Promise<CsvImportResult> {
  const { onProgress, pieceBytes = 1 << 20, ...importOptions } = options;
  const { size } = await stat(path);
  const importer = createCsvImporter(mapping, importOptions);
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: pieceBytes });
  let read = 0;
  for await (const piece of stream as AsyncIterable<string>) {
    importer.push(piece);
    read += Buffer.byteLength(piece);
    onProgress?.(size > 0 ? Math.min(1, read / size) : 1);
  }
  return importer.finish();
}
