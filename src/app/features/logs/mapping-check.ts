import type { MappingPreset } from '@shared/contracts/logs';
import { isImportError } from '@shared/import/import-error';
import { SNIFF_LENGTH, sniffCsv, type CsvSniff } from '@shared/import/sniff-csv';
import {
  headerSignature,
  suggestMapping,
  type MappingSuggestion,
} from '@shared/import/suggest-mapping';
import { from, map, of, switchMap, type Observable } from 'rxjs';
import { isSuggestionTrusted } from './mapping-model';

/** The head of a file as text, and whether the file goes on beyond it. */
export interface FileHead {
  /** The first {@link SNIFF_LENGTH} bytes, decoded as UTF-8. */
  readonly text: string;
  /** Whether the file is longer than the head (its last line may then be cut). */
  readonly isTruncated: boolean;
}

/** What the head of a file says about its columns. */
export interface HeadReading {
  /** Layout, columns and sample rows. */
  readonly sniff: CsvSniff;
  /** The suggested mapping with a confidence per channel. */
  readonly suggestion: MappingSuggestion;
  /** The header's signature, which presets are saved under. */
  readonly signature: string;
}

/** Whether a file can go as it is, or its mapping needs a person first. */
export type MappingCheck =
  | {
      readonly kind: 'ready';
      /** A preset exists, the suggestion is sure, or the head cannot be read (the server says why). */
      readonly reason: 'preset' | 'trusted' | 'unreadable';
    }
  | ({ readonly kind: 'review' } & HeadReading);

/**
 * Reads the first 64 KiB of a file, the part the server's own check reads too, without loading
 * the rest (a log can be hundreds of megabytes).
 */
export async function readFileHead(file: Blob): Promise<FileHead> {
  const bytes = await file.slice(0, SNIFF_LENGTH).arrayBuffer();
  // `stream: true` holds back a character cut at the end of the head instead of garbling it.
  const text = new TextDecoder('utf-8').decode(bytes, { stream: true });
  return { text, isTruncated: file.size > bytes.byteLength };
}

/** Sniffs a file's head and suggests its mapping; null when the head has no usable header. */
export function readHead(head: FileHead): HeadReading | null {
  try {
    const sniff = sniffCsv(head.text, { isTruncated: head.isTruncated });
    return { sniff, suggestion: suggestMapping(sniff), signature: headerSignature(sniff.columns) };
  } catch (err) {
    // A file with no header or no data goes to the server anyway, whose answer names the row.
    if (isImportError(err)) return null;
    throw err;
  }
}

/**
 * Decides whether a file needs the mapping dialog: not when the shop has a preset for its header
 * (the server then uses it), nor when every required channel is suggested with enough
 * confidence; otherwise the head's reading goes to the dialog.
 */
export function checkMapping(
  file: Blob,
  findPreset: (signature: string) => Observable<MappingPreset | null>,
): Observable<MappingCheck> {
  return from(readFileHead(file)).pipe(
    switchMap((head): Observable<MappingCheck> => {
      const reading = readHead(head);
      if (reading === null) return of({ kind: 'ready', reason: 'unreadable' });
      return findPreset(reading.signature).pipe(
        map((preset): MappingCheck => {
          if (preset !== null) return { kind: 'ready', reason: 'preset' };
          if (isSuggestionTrusted(reading.suggestion)) return { kind: 'ready', reason: 'trusted' };
          return { kind: 'review', ...reading };
        }),
      );
    }),
  );
}
