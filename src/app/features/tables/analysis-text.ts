import type { LogResource } from '@shared/contracts/logs';
import type { LeanFlag, LogFilterReport } from '../../core/api/analyses-api';
import type { PreviewSummary } from './proposal-preview-compute';

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

/** A signed percentage with one decimal and a real minus sign, e.g. "+2.5 %" or "−1.0 %". */
function signedPct(value: number): string {
  const text = Math.abs(value).toFixed(1);
  if (text === '0.0') return '0.0 %';
  return `${value > 0 ? '+' : '\u2212'}${text} %`;
}

/** What a preview of an apply changes, in one sentence. */
export function previewSummaryLine(
  summary: PreviewSummary,
  rpmAxis: readonly number[],
  mapAxisKpa: readonly number[],
): string {
  if (summary.changed === 0) return 'No cell changes with these options.';
  const cells = summary.changed === 1 ? '1 cell changes' : `${summary.changed} cells change`;
  const at = summary.largestAt;
  const where =
    at && rpmAxis[at[1]] !== undefined && mapAxisKpa[at[0]] !== undefined
      ? ` at ${rpmAxis[at[1]]} rpm × ${mapAxisKpa[at[0]]} kPa`
      : '';
  return (
    `${cells}: mean ${signedPct(summary.meanChangePct)}, largest ` +
    `${signedPct(summary.largestChangePct)}${where}; ${summary.richer} richer (VE up), ` +
    `${summary.leaner} leaner (VE down).`
  );
}

/** How many locked cells an apply keeps, in words. */
export function lockedLine(count: number): string {
  if (count === 0) return 'No cells are locked.';
  return count === 1
    ? '1 locked cell keeps its value.'
    : `${count.toLocaleString('en-GB')} locked cells keep their value.`;
}
