import { validateMapping, type ColumnMapping } from './column-mapping';
import { ImportError } from './import-error';
import { sniffCsv, SNIFF_LENGTH, type CsvSniff } from './sniff-csv';
import { suggestMapping, type MappingSuggestion } from './suggest-mapping';

/** Options of {@link planImport}. */
export interface PlanImportOptions {
  /** Barometric pressure (kPa) to use with gauge boost when the file logs none. */
  readonly baroKpa?: number;
  /** Whether the head text stops inside the file (default: when it is 64 KiB or longer). */
  readonly isTruncated?: boolean;
}

/** How a file will be read: the layout found, the complete mapping, and the suggestion if any. */
export interface ImportPlan {
  /** What the sniffer found in the head of the file. */
  readonly sniff: CsvSniff;
  /** The mapping to apply, every layout field filled in. */
  readonly mapping: ColumnMapping;
  /** The suggestion the mapping came from, or null when the caller gave one. */
  readonly suggestion: MappingSuggestion | null;
}

/** The caller's mapping with the layout fields it leaves out taken from the sniffer. */
function completeMapping(mapping: ColumnMapping, sniff: CsvSniff): ColumnMapping {
  const headerRow = mapping.headerRow ?? sniff.headerRow;
  // The sniffed units row belongs to the sniffed header; another header row has none we know of.
  const sniffedUnits = headerRow === sniff.headerRow ? sniff.unitsRow : null;
  return {
    headerRow,
    unitsRow: mapping.unitsRow === undefined ? sniffedUnits : mapping.unitsRow,
    delimiter: mapping.delimiter ?? sniff.delimiter,
    decimal: mapping.decimal ?? (mapping.delimiter === ',' ? '.' : sniff.decimal),
    channels: mapping.channels,
  };
}

/**
 * Reads the head of a file (its first 64 KiB as text) and settles how to import it: the
 * caller's mapping completed with the detected layout, or a suggested one. Throws an
 * ImportError at once when the header is missing, there is no data, a mapped column is not in
 * the header, or required channels cannot be mapped, so a server can refuse the upload before
 * reading the rest.
 */
export function planImport(
  headText: string,
  mapping?: ColumnMapping,
  options: PlanImportOptions = {},
): ImportPlan {
  if (typeof headText !== 'string') throw new Error('planImport: headText must be a string');
  const isTruncated = options.isTruncated ?? headText.length >= SNIFF_LENGTH;
  const sniff = sniffCsv(headText.slice(0, SNIFF_LENGTH), { isTruncated });
  if (mapping === undefined) {
    const suggestion = suggestMapping(sniff, { defaultBaroKpa: options.baroKpa });
    if (suggestion.missing.length > 0) {
      throw new ImportError(
        'missing_channels',
        `no column found for required channels: ${suggestion.missing.join(', ')}`,
        { missing: suggestion.missing },
      );
    }
    return { sniff, mapping: suggestion.mapping, suggestion };
  }
  validateMapping(mapping);
  const complete = completeMapping(mapping, sniff);
  if (complete.headerRow === sniff.headerRow) {
    const names = new Set(sniff.columns.map((c) => c.name.toLowerCase()));
    const unknown = Object.values(complete.channels)
      .map((entry) => entry?.column ?? '')
      .filter((column) => !names.has(column.trim().toLowerCase()));
    if (unknown.length > 0) {
      throw new ImportError(
        'unknown_column',
        `mapped columns not in the header: ${unknown.join(', ')}`,
        { missing: unknown, row: sniff.headerRow },
      );
    }
  }
  return { sniff, mapping: complete, suggestion: null };
}
