import { parse, Parser } from 'papaparse';
import type { ColumnMapping } from './column-mapping';
import { createLogBuilder, type LogBuilder, type LogBuilderOptions } from './log-builder';
import type { LogBuildResult } from './log-build-result';
import { planImport } from './plan-import';
import { SNIFF_LENGTH } from './sniff-csv';
import type { MappingSuggestion } from './suggest-mapping';

/** Options of {@link parseCsvText} and {@link parseCsvChunks}. */
export type ParseCsvOptions = Omit<LogBuilderOptions, 'columns'>;

/** A whole import: the log and its problems, plus the mapping used and the suggestion if any. */
export interface CsvImportResult extends LogBuildResult {
  /** The mapping that was applied (returned with the log). */
  readonly mapping: ColumnMapping;
  /** The suggestion the mapping came from, or null when the caller gave one. */
  readonly suggestion: MappingSuggestion | null;
}

/** The line break a text uses (papaparse needs it fixed to parse piece by piece). */
function detectNewline(text: string): '\r\n' | '\n' | '\r' {
  if (text.includes('\r\n')) return '\r\n';
  return text.includes('\r') && !text.includes('\n') ? '\r' : '\n';
}

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
  const iterator = chunks[Symbol.iterator]();
  let pending = '';
  let isDone = false;
  while (!isDone && pending.length <= SNIFF_LENGTH) {
    const step = iterator.next();
    if (step.done) isDone = true;
    else pending += step.value;
  }
  // papaparse's whole-text parse drops a byte-order mark by itself; its piecewise parser does not.
  pending = pending.replace(/^\uFEFF/, '');
  const plan = planImport(pending.slice(0, SNIFF_LENGTH), mapping, {
    baroKpa: options.baroKpa,
    isTruncated: pending.length > SNIFF_LENGTH,
  });
  const builder = createLogBuilder(plan.mapping, options);
  // papaparse's own incremental parser: with ignoreLastRow it keeps back the last, possibly
  // unfinished, row and says where it starts, so lines and quoted fields may span pieces.
  const parser = new Parser({
    delimiter: plan.mapping.delimiter,
    newline: detectNewline(pending.slice(0, SNIFF_LENGTH)),
  });
  let rowNumber = 0;
  const flush = (isLast: boolean): void => {
    const result = parser.parse(pending, 0, !isLast) as {
      data: string[][];
      meta: { cursor: number };
    };
    const rows = result.data;
    pending = isLast ? '' : pending.slice(result.meta.cursor);
    builder.pushRows(rows, rowNumber);
    rowNumber += rows.length;
  };
  flush(isDone);
  while (!isDone) {
    const step = iterator.next();
    if (step.done) isDone = true;
    else pending += step.value;
    flush(isDone);
  }
  return { ...builder.finish(), mapping: plan.mapping, suggestion: plan.suggestion };
}
