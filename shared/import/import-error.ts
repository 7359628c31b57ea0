/**
 * Why a file cannot be imported. The server maps these to its error answers: `no_header`,
 * `no_data` and `invalid_mapping` to 400; `missing_channels`, `unknown_column` and
 * `no_usable_rows` to 422 (unusable file).
 */
export type ImportErrorCode =
  | 'no_header'
  | 'no_data'
  | 'invalid_mapping'
  | 'missing_channels'
  | 'unknown_column'
  | 'no_usable_rows';

/** Extra facts carried by an {@link ImportError}, safe to send back to the client as is. */
export interface ImportErrorDetails {
  /** Required channels (or mapped columns) that are missing. */
  readonly missing?: readonly string[];
  /** The file row the error refers to, counting lines from 0. */
  readonly row?: number;
  /** The CSV column the error refers to. */
  readonly column?: string;
  /** The mapping field at fault, as a dotted path (`channels.iat.unit`). */
  readonly field?: string;
}

/** A file or mapping the import stage cannot use; `code` says why, `details` what exactly. */
export class ImportError extends Error {
  /** A stable code the server and client can branch on. */
  readonly code: ImportErrorCode;
  /** What is missing or at fault. */
  readonly details: ImportErrorDetails;

  constructor(code: ImportErrorCode, message: string, details: ImportErrorDetails = {}) {
    super(message);
    this.name = 'ImportError';
    this.code = code;
    this.details = details;
  }
}

/** Whether a thrown value is an {@link ImportError} (also across bundles, by its shape). */
export function isImportError(value: unknown): value is ImportError {
  if (value instanceof ImportError) return true;
  return (
    value instanceof Error &&
    value.name === 'ImportError' &&
    typeof (value as { code?: unknown }).code === 'string'
  );
}
