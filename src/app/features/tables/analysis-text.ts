import type { LogResource } from '@shared/contracts/logs';
import type { LeanFlag, LogFilterReport } from '../../core/api/analyses-api';

/** The caution shown with every lean-under-load flag. */
export const LEAN_CAUTION =
  'Measured leaner than commanded under load — verify before any further full-load running; a qualified person decides.';

/** One line naming a log for a person: file, kind, length and samples. */
export function logLine(log: LogResource): string {
  const parts: string[] = [log.kind === 'dyno' ? 'dyno' : 'road'];
  if (log.durationS !== null) parts.push(`${(log.durationS / 60).toFixed(1)} min`);
  if (log.sampleCount !== null) parts.push(`${log.sampleCount.toLocaleString('en-GB')} samples`);
  return `${log.fileName} (${parts.join(', ')})`;
}

/** The delay an analysis applied to a log, in words. */
export function delayLine(report: LogFilterReport): string {
  const { tau0S, kGrams, source } = report.delayUsed;
  const from = source === 'estimate' ? 'estimated from this log' : 'from the settings';
  return `Wideband delay τ₀ ${tau0S.toFixed(3)} s, K ${kGrams.toFixed(2)} g (${from}).`;
}

/** Kept samples of a log as a sentence with the share kept. */
export function keptLine(report: LogFilterReport): string {
  const share = report.samples > 0 ? (100 * report.kept) / report.samples : 0;
  return `${report.kept.toLocaleString('en-GB')} of ${report.samples.toLocaleString('en-GB')} samples kept (${share.toFixed(0)} %).`;
}

/** A lean flag in words: where, how lean on average and at worst, and its severity. */
export function leanFlagLine(flag: LeanFlag): string {
  const worst =
    flag.worstLeanPercent === null ? '' : `, worst ${flag.worstLeanPercent.toFixed(1)} %`;
  const severity = flag.severity === 'abort' ? 'stop' : 'warning';
  return `${flag.rpm} rpm × ${flag.mapKpa} kPa: ${flag.leanPercent.toFixed(1)} % lean on average${worst} (${severity})`;
}
