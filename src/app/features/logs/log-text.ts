import { HttpErrorResponse } from '@angular/common/http';
import { hasAnyRole } from '@shared/auth/access';
import type { BeyondTable, MappingSource } from '@shared/contracts/logs';
import type { UnitSystem } from '@shared/contracts/preferences';
import type { Role } from '@shared/contracts/roles';
import { apiErrorMessage } from '../../core/api/api-error';
import { formatQuantity } from '../../ui/units/format-quantity';

export {
  LOG_STATUS_LABELS,
  durationText as formatDuration,
  isLogPending as isPending,
  logStatusText as statusLabel,
} from '../../ui/parts/log-status';

/** Where a log's column mapping came from, in words. */
export const MAPPING_SOURCE_LABELS: Readonly<Record<MappingSource, string>> = {
  given: 'given with the upload',
  preset: 'the shop’s saved mapping for this header',
  suggested: 'suggested from the header and values',
};

/** The roles that may upload logs (the server refuses others with 403). */
export const LOG_UPLOADERS: readonly Role[] = ['tuner', 'operator'];

/** Whether a member holding `roles` may upload logs. */
export function canUploadLogs(roles: readonly Role[]): boolean {
  return hasAnyRole(roles, LOG_UPLOADERS);
}

/** A size in bytes as "812 B", "4.2 KB" or "37.5 MB" (decimal units, as the limit is stated). */
export function formatBytes(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} KB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

/** Why an upload was refused, for a person, and the existing log when it was a duplicate. */
export interface UploadFailure {
  /** A sentence saying what was wrong and what to do. */
  message: string;
  /** The log that already holds this file (409), else null. */
  existingLogId: string | null;
}

/** The `details` object of an API error answer, or an empty one. */
function errorDetails(error: HttpErrorResponse): Record<string, unknown> {
  const body = error.error as { error?: { details?: unknown } } | null;
  const details = body?.error?.details;
  return typeof details === 'object' && details !== null
    ? (details as Record<string, unknown>)
    : {};
}

/** The strings of an unknown list value. */
function stringList(value: unknown): string[] {
  return Array.isArray(value) ? value.filter((item) => typeof item === 'string') : [];
}

/** Turns a refused upload into words: missing channels (422), the duplicate (409), the limit (413). */
export function uploadFailure(error: unknown): UploadFailure {
  const plain = (message: string): UploadFailure => ({ message, existingLogId: null });
  if (!(error instanceof HttpErrorResponse)) return plain('The upload failed.');
  const details = errorDetails(error);
  if (error.status === 422) {
    const missing = stringList(details['missing']);
    if (missing.length === 0) return plain(apiErrorMessage(error, 'The file cannot be used.'));
    if (details['reason'] === 'unknown_column') {
      return plain(`The mapping names columns this file does not have: ${missing.join(', ')}.`);
    }
    return plain(`No column found for: ${missing.join(', ')}.`);
  }
  if (error.status === 409 && typeof details['logId'] === 'string') {
    return {
      message: 'This vehicle already has a log with exactly this content.',
      existingLogId: details['logId'],
    };
  }
  if (error.status === 413) {
    const maxBytes = details['maxBytes'];
    return plain(
      typeof maxBytes === 'number'
        ? `The file is larger than the ${formatBytes(maxBytes)} limit.`
        : 'The file is larger than the server accepts.',
    );
  }
  return plain(apiErrorMessage(error, 'The upload failed.'));
}

/** A fraction 0–1 of bytes sent, or null when the total is unknown. */
export function sentFraction(loaded: number, total: number | undefined): number | null {
  if (total === undefined || total <= 0) return null;
  return Math.min(1, Math.max(0, loaded / total));
}

/** A share 0–1 as "18 %", or "under 1 %" for a small non-zero share. */
function shareText(share: number): string {
  if (share > 0 && share < 0.01) return 'under 1 %';
  return `${Math.round(share * 100)} %`;
}

/**
 * How a log runs past the top of a table, in one sentence in the user's units: e.g. "Runs past
 * the top of “Main VE”: 18 % of the samples are above its top MAP of 105 kPa (the log reaches
 * 196 kPa). They count toward the table's edge cells."
 */
export function beyondTableText(beyond: BeyondTable, units: UnitSystem): string {
  const parts: string[] = [];
  if (beyond.logMapMaxKpa > beyond.mapTopKpa) {
    const share = beyond.shareAboveMap === null ? 'some' : shareText(beyond.shareAboveMap);
    parts.push(
      `${share} of the samples are above its top MAP of ` +
        `${formatQuantity('pressure', beyond.mapTopKpa, units)} (the log reaches ` +
        `${formatQuantity('pressure', beyond.logMapMaxKpa, units)})`,
    );
  }
  if (beyond.logRpmMax > beyond.rpmTop) {
    const share = beyond.shareAboveRpm === null ? 'some' : shareText(beyond.shareAboveRpm);
    parts.push(
      `${share} are above its top RPM of ${Math.round(beyond.rpmTop)} ` +
        `(the log reaches ${Math.round(beyond.logRpmMax)})`,
    );
  }
  return (
    `Runs past the top of “${beyond.tableName}”: ${parts.join('; ')}. ` +
    'They count toward the table’s edge cells; a table whose axes cover them fits this engine better.'
  );
}
