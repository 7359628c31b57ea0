// How a log's parse state and duration read, shared by the vehicles and logs pages.
import type { LogResource, LogStatus } from '@shared/contracts/logs';

/** Display names of a log's parse states. */
export const LOG_STATUS_LABELS: Readonly<Record<LogStatus, string>> = {
  queued: 'Queued',
  parsing: 'Parsing',
  ready: 'Ready',
  failed: 'Failed',
};

/** A log's state for its chip, with progress while it is still being read: "Parsing 40 %". */
export function logStatusText(log: Pick<LogResource, 'status' | 'progress'>): string {
  const label = LOG_STATUS_LABELS[log.status];
  if (log.status !== 'parsing') return label;
  return `${label} ${Math.round(Math.min(1, Math.max(0, log.progress)) * 100)} %`;
}

/** Whether a log is still waiting or being read (its figures are not known yet). */
export function isLogPending(log: Pick<LogResource, 'status'>): boolean {
  return log.status === 'queued' || log.status === 'parsing';
}

/** A duration in seconds as "12 min 05 s", "45 s" or "1 h 02 min"; an em dash when unknown. */
export function durationText(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds) || seconds < 0) return '—';
  const total = Math.round(seconds);
  const h = Math.floor(total / 3600);
  const min = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const pad = (n: number): string => String(n).padStart(2, '0');
  if (h > 0) return `${h} h ${pad(min)} min`;
  if (min > 0) return `${min} min ${pad(s)} s`;
  return `${s} s`;
}
