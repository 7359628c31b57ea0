import type { VeTable } from '../../shared/core/table';
import type { ExportRevisionQuery } from '../../shared/contracts/tables';

/** The text of the corner cell: what the rows and the columns are. */
export const CORNER_LABEL = 'map_kpa\\rpm';

/** Content type and separator of each export format. */
const FORMATS: Readonly<
  Record<ExportRevisionQuery['format'], { contentType: string; separator: string }>
> = {
  csv: { contentType: 'text/csv; charset=utf-8', separator: ',' },
  tsv: { contentType: 'text/tab-separated-values; charset=utf-8', separator: '\t' },
};

/**
 * A number as plain text: JavaScript's shortest round-trip form, which never uses thousands
 * separators or a decimal comma, so any spreadsheet or script reads back exactly what is stored.
 */
function formatNumber(value: number): string {
  return Object.is(value, -0) ? '0' : String(value);
}

/**
 * A table as delimited text: the first row the corner label then the RPM breakpoints, each next
 * row a MAP breakpoint then its values. Lines end in CRLF as RFC 4180 asks; nothing needs
 * quoting since every field is a number or the fixed corner label.
 */
export function formatTableText(table: VeTable, format: ExportRevisionQuery['format']): string {
  const { separator } = FORMATS[format];
  const lines = [[CORNER_LABEL, ...table.rpmAxis.map(formatNumber)].join(separator)];
  table.mapAxisKpa.forEach((mapKpa, row) => {
    const values = (table.values[row] ?? []).map(formatNumber);
    lines.push([formatNumber(mapKpa), ...values].join(separator));
  });
  return lines.map((line) => `${line}\r\n`).join('');
}

/** The content type of an export format. */
export function exportContentType(format: ExportRevisionQuery['format']): string {
  return FORMATS[format].contentType;
}

/** A file name made of safe characters: `<table name>-r<number>.<format>`. */
export function exportFileName(
  tableName: string,
  revisionNumber: number,
  format: ExportRevisionQuery['format'],
): string {
  const stem = tableName
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return `${stem || 've-table'}-r${revisionNumber}.${format}`;
}
