/**
 * Why a table file cannot be read. Every code names one thing the user can fix in the file (or,
 * for the two `ambiguous_*` codes, a choice the caller must make).
 */
export type TableFileErrorCode =
  | 'empty_file'
  | 'no_table'
  | 'missing_header'
  | 'ragged_row'
  | 'empty_cell'
  | 'not_a_number'
  | 'duplicate_breakpoint'
  | 'falling_breakpoint'
  | 'too_few_breakpoints'
  | 'too_many_breakpoints'
  | 'axis_out_of_range'
  | 'value_out_of_range'
  | 'ambiguous_orientation'
  | 'ambiguous_pressure_unit'
  | 'gauge_pressure';

/** Which axis of the table an error is about. */
export type TableAxisName = 'rpm' | 'map';

/** Where in the file an error sits and which breakpoint it concerns; all optional. */
export interface TableFileErrorDetails {
  /** The file line, counting from 0 (blank and title lines count too). */
  readonly row?: number;
  /** The cell within that line, counting from 0 (the corner cell is column 0). */
  readonly column?: number;
  /** The axis at fault, for breakpoint errors. */
  readonly axis?: TableAxisName;
  /** The breakpoint's index within its axis, from 0. */
  readonly index?: number;
}

/** A table file the parser refuses; nothing of the table is returned with it. */
export class TableFileError extends Error {
  /** A stable code the server and client can branch on. */
  readonly code: TableFileErrorCode;
  /** The file line, from 0, when the error has one. */
  readonly row?: number;
  /** The cell within the line, from 0, when the error has one. */
  readonly column?: number;
  /** The axis at fault, for breakpoint errors. */
  readonly axis?: TableAxisName;
  /** The breakpoint's index within its axis. */
  readonly index?: number;

  constructor(code: TableFileErrorCode, message: string, details: TableFileErrorDetails = {}) {
    super(message);
    this.name = 'TableFileError';
    this.code = code;
    // Assigned only when given, so a plain object copy (for JSON) carries no undefined keys.
    if (details.row !== undefined) this.row = details.row;
    if (details.column !== undefined) this.column = details.column;
    if (details.axis !== undefined) this.axis = details.axis;
    if (details.index !== undefined) this.index = details.index;
  }
}

/** Whether a thrown value is a {@link TableFileError} (also across bundles, by its shape). */
export function isTableFileError(value: unknown): value is TableFileError {
  if (value instanceof TableFileError) return true;
  return (
    value instanceof Error &&
    value.name === 'TableFileError' &&
    typeof (value as { code?: unknown }).code === 'string'
  );
}
