import { Parser } from 'papaparse';
import type { ColumnMapping, Newline } from './column-mapping';
import { createLogBuilder, type LogBuilder, type LogBuilderOptions } from './log-builder';
import type { LogBuildResult } from './log-build-result';
import { planImport, type ImportPlan } from './plan-import';
import { SNIFF_LENGTH } from './sniff-csv';
import type { MappingSuggestion } from './suggest-mapping';

/** Options of the CSV import entry points. */
export type ParseCsvOptions = Omit<LogBuilderOptions, 'columns'>;

/** A whole import: the log and its problems, plus the mapping used and the suggestion if any. */
export interface CsvImportResult extends LogBuildResult {
  /** The mapping that was applied (returned with the log). */
  readonly mapping: ColumnMapping;
  /** The suggestion the mapping came from, or null when the caller gave one. */
  readonly suggestion: MappingSuggestion | null;
}

/** Takes a CSV file as text pieces cut anywhere, and builds the log as they arrive. */
export interface CsvImporter {
  /** Adds the next piece of the file's text. */
  push(text: string): void;
  /** The plan (layout and mapping) once the head of the file has been seen, else null. */
  readonly plan: ImportPlan | null;
  /** Ends the file; throws an ImportError when it cannot be used. */
  finish(): CsvImportResult;
}

/** The line break a text uses (papaparse needs it fixed to parse piece by piece). */
export function detectNewline(text: string): Newline {
  if (text.includes('\r\n')) return '\r\n';
  return text.includes('\r') && !text.includes('\n') ? '\r' : '\n';
}

/**
 * A push-based CSV import, the core of every streaming entry point: it keeps the first 64 KiB
 * to sniff and map (suggesting a mapping when none is given; an ImportError as soon as the
 * head shows the file cannot be used), then hands text without quotes to the builder line by
 * line and quoted text to papaparse's incremental parser. Either keeps back the last, possibly
 * unfinished, row — so a line or a quoted field may span pieces and at most one unfinished row
 * is held besides the log being built.
 */
export function createCsvImporter(
  mapping: ColumnMapping | undefined,
  options: ParseCsvOptions,
): CsvImporter {
  let pending = '';
  let plan: ImportPlan | null = null;
  let builder: LogBuilder | null = null;
  let parser: Parser | null = null;
  let rowNumber = 0;
  let isFinished = false;
  let newline: Newline = '\n';

  const start = (isWhole: boolean): void => {
    // papaparse's whole-text parse drops a byte-order mark by itself; its piecewise one does not.
    pending = pending.replace(/^\uFEFF/, '');
    const head = pending.slice(0, SNIFF_LENGTH);
    plan = planImport(head, mapping, {
      baroKpa: options.baroKpa,
      isTruncated: !isWhole || pending.length > SNIFF_LENGTH,
    });
    builder = createLogBuilder(plan.mapping, options);
    newline = detectNewline(head);
    parser = new Parser({ delimiter: plan.mapping.delimiter, newline });
  };

  const flush = (isLast: boolean): void => {
    if (!parser || !builder || !plan) return;
    // Without a quote character in the pending text, a row is a line and a cell is what lies
    // between delimiters: the builder scans the lines in place, as papaparse's own fast mode
    // splits them but without a string per cell or its per-row bookkeeping (several times
    // faster on a million rows). Quoted text goes to papaparse.
    if (pending.indexOf('"') === -1) {
      let lines: string;
      if (isLast) {
        if (pending === '') return;
        // The final line break ends the last line; it does not start an empty one.
        lines = pending.endsWith(newline) ? pending.slice(0, -newline.length) : pending;
        pending = '';
      } else {
        const cut = pending.lastIndexOf(newline);
        if (cut < 0) return;
        lines = pending.slice(0, cut);
        pending = pending.slice(cut + newline.length);
      }
      rowNumber += builder.pushUnquotedLines(lines, newline, rowNumber);
      return;
    }
    const result = parser.parse(pending, 0, !isLast) as {
      data: string[][];
      meta: { cursor: number };
    };
    pending = isLast ? '' : pending.slice(result.meta.cursor);
    builder.pushRows(result.data, rowNumber);
    rowNumber += result.data.length;
  };

  /**
   * The fast path of a piece without quotes after quote-free text: its lines go to the builder
   * straight from the piece, the unfinished row joined to its first line only, so the piece is
   * never copied into a longer string. False when the piece needs `flush`.
   */
  const pushUnquotedPiece = (text: string): boolean => {
    const cut = text.lastIndexOf(newline);
    if (cut < 0 || text.indexOf('"') !== -1 || pending.indexOf('"') !== -1) return false;
    // A CRLF whose CR ended the last piece breaks the line at the join.
    const isSplitBreak = newline === '\r\n' && pending.endsWith('\r') && text.startsWith('\n');
    const first = isSplitBreak ? -1 : text.indexOf(newline);
    const head = isSplitBreak ? pending.slice(0, -1) : pending + text.slice(0, first);
    const target = builder as LogBuilder;
    rowNumber += target.pushUnquotedLines(head, newline, rowNumber);
    const bodyStart = isSplitBreak ? 1 : first + newline.length;
    if (bodyStart <= cut) {
      rowNumber += target.pushUnquotedLines(text.slice(bodyStart, cut), newline, rowNumber);
    }
    pending = text.slice(cut + newline.length);
    return true;
  };

  return {
    get plan() {
      return plan;
    },
    push(text: string): void {
      if (isFinished) throw new Error('CsvImporter: push after finish');
      if (typeof text !== 'string') throw new Error('CsvImporter: push takes text');
      if (plan && pushUnquotedPiece(text)) return;
      pending += text;
      if (!plan && pending.length > SNIFF_LENGTH) start(false);
      if (plan) flush(false);
    },
    finish(): CsvImportResult {
      if (isFinished) throw new Error('CsvImporter: finish called twice');
      isFinished = true;
      if (!plan) start(true);
      flush(true);
      const done = plan as ImportPlan;
      return {
        ...(builder as LogBuilder).finish(),
        mapping: done.mapping,
        suggestion: done.suggestion,
      };
    },
  };
}
