import { parse } from 'papaparse';
import type { ColumnMapping } from './column-mapping';
import {
  createCsvImporter,
  detectNewline,
  type CsvImportResult,
  type ParseCsvOptions,
} from './csv-importer';
import { createLogBuilder, type LogBuilder } from './log-builder';
import { planImport } from './plan-import';
import { SNIFF_LENGTH } from './sniff-csv';

/**
 * Sniffs, maps (suggesting a mapping when none is given) and imports a whole CSV text in one
 * call with papaparse. Throws an ImportError when the file cannot be used. For big files prefer
 * {@link parseCsvChunks} or a papaparse stream with {@link createPapaChunkHandler}: this one holds
 * every cell's text at once (about twice as slow at a million rows, from garbage collection).
 */
export function parseCsvText(
  text: string,
  mapping: ColumnMapping | undefined,
  options: ParseCsvOptions,
): CsvImportResult {
  if (typeof text !== 'string') throw new Error('parseCsvText: text must be a string');
  const plan = planImport(text.slice(0, SNIFF_LENGTH), mapping, {
    baroKpa: options.baroKpa,
    isTruncated: text.length > SNIFF_LENGTH,
  });
  const builder = createLogBuilder(plan.mapping, options);
  // Every row's strings exist at once here; parseCsvChunks keeps one piece at a time.
  const { data } = parse<string[]>(text, {
    delimiter: plan.mapping.delimiter,
    newline: detectNewline(text.slice(0, SNIFF_LENGTH)),
    header: false,
    skipEmptyLines: false,
  });
  builder.pushRows(data, 0);
  return { ...builder.finish(), mapping: plan.mapping, suggestion: plan.suggestion };
}

/**
 * A handler for papaparse's `chunk` callback (streaming a file with `header: false` and
 * `skipEmptyLines: false`) that feeds each chunk's rows to `builder`, numbering them from
 * `firstRowNumber` (0 when the stream starts at the top of the file).
 */
export function createPapaChunkHandler(
  builder: LogBuilder,
  firstRowNumber = 0,
): (results: { readonly data: readonly (readonly string[])[] }) => void {
  let next = firstRowNumber;
  return (results) => {
    builder.pushRows(results.data, next);
    next += results.data.length;
  };
}

/**
 * Imports a CSV file given as text pieces cut anywhere (a line or a quoted field may span
 * pieces), holding at most one unfinished row besides the log being built. The first 64 KiB
 * are used to sniff and map, as {@link parseCsvText} does; the result is the same.
 */
export function parseCsvChunks(
  chunks: Iterable<string>,
  mapping: ColumnMapping | undefined,
  options: ParseCsvOptions,
): CsvImportResult {
  if (chunks === null || typeof chunks !== 'object' || !(Symbol.iterator in chunks)) {
    throw new Error('parseCsvChunks: chunks must be an iterable of strings');
  }
  const importer = createCsvImporter(mapping, options);
  for (const chunk of chunks) importer.push(chunk);
  return importer.finish();
}
