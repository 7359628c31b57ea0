import type { UnitSystem } from '@shared/contracts/preferences';
import type { LogResource } from '@shared/contracts/logs';
import type {
  AnalysisGuard,
  LeanFlag,
  LeanSeverity,
  LogFilterReport,
} from '../../../core/api/analyses-api';
import { formatQuantity } from '../../../ui/units/format-quantity';
import type { OriginCounts, PreviewSummary } from '../preview/proposal-preview-compute';

/** The caution shown with every lean-under-load flag. */
export const LEAN_CAUTION =
  'Measured leaner than commanded under load — verify before any further full-load running; a qualified person decides.';

/** The word a lean flag's severity is shown with, and what the user should do about it. */
export const LEAN_SEVERITY: Readonly<
  Record<LeanSeverity, { readonly word: string; readonly action: string }>
> = {
  abort: { word: 'stop', action: 'stop loading the engine in this cell until it is richer' },
  warn: { word: 'warning', action: 'richen this cell before the next full-load run' },
  watch: { word: 'watch', action: 'too little data to act on: log this cell again' },
};

/** What "stop" and "warning" ask of the user, said once wherever the words appear. */
export const LEAN_WORDS_EXPLAINED =
  '“Stop”: stop loading the engine in that cell until it is richer. “Warning”: richen the cell before the next full-load run.';

/** Whether a flag is loud ('warn' or 'abort': enough data to act on) rather than a 'watch'. */
export function isLoudFlag(flag: Pick<LeanFlag, 'severity'>): boolean {
  return flag.severity !== 'watch';
}

/** The quiet line for lean flags that rest on too little data. */
export function watchLine(count: number): string {
  return count === 1
    ? '1 cell looks lean but rests on too little data: log it again.'
    : `${count} cells look lean but rest on too little data: log them again.`;
}

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

/** A lean flag in words: where, how lean on average and at worst, and its severity's word. */
export function leanFlagLine(flag: LeanFlag): string {
  const worst =
    flag.worstLeanPercent === null ? '' : `, worst ${flag.worstLeanPercent.toFixed(1)} %`;
  const severity = LEAN_SEVERITY[flag.severity].word;
  return `${flag.rpm} rpm × ${flag.mapKpa} kPa: ${flag.leanPercent.toFixed(1)} % lean on average${worst} (${severity})`;
}

/** The analysis's lean flags counted for its summary: "3 lean-under-load flags, 2 to watch". */
export function leanCountText(flags: readonly LeanFlag[]): string {
  const loud = flags.filter(isLoudFlag).length;
  const watch = flags.length - loud;
  const flagsText = `${loud} lean-under-load ${loud === 1 ? 'flag' : 'flags'}`;
  return watch > 0 ? `${flagsText}, ${watch} more to watch (too little data)` : flagsText;
}

/** Where the barometric pressure behind the load line came from, in words. */
const BARO_SOURCE_TEXT: Readonly<Record<AnalysisGuard['baroSource'], string>> = {
  logged: 'read from the logs’ barometer',
  engine_off: 'read from MAP while the engine stood still',
  assumed: 'assumed as standard sea-level pressure: the logs hold no barometer or engine-off MAP',
};

/**
 * The fuel-safety guard of an analysis in words, pressures in the user's units: the load line,
 * what it is a share of and where that came from, and the allowance.
 */
export function guardLine(guard: AnalysisGuard, units: UnitSystem): string {
  const line = formatQuantity('pressure', guard.loadLineKpa, units);
  const baro = formatQuantity('pressure', guard.baroKpa, units);
  return (
    `Load line ${line} (${guard.loadLinePercentOfBaro} % of ${baro} barometric pressure, ` +
    `${BARO_SOURCE_TEXT[guard.baroSource]}); lean allowance ${guard.leanAllowancePercent} %.`
  );
}

/** What the guard does, in one sentence. */
export const GUARD_EXPLAINED =
  'At or above the load line, a cell without trusted data may be made richer by the fill or the smoothing, but never leaner than the allowance: such a cell keeps its value and is held as needing data. Cells measured by the logs are corrected as measured.';

/** Where the load line and the allowance are set. */
export const GUARD_SETTING_HINT =
  'The load line (% of barometric pressure) and the allowance are settings of the vehicle.';

/** The caution shown while the user has turned the guard off. */
export const GUARD_OFF_CAUTION =
  'Guard off: the fill and the smoothing may lean cells under load that no log measured — lean mixture under load is how engines are damaged. The draft revision records that the guard was turned off.';

/** The held cells of a preview in words. */
export function heldLine(heldCount: number, isGuardOn: boolean): string {
  if (!isGuardOn) return 'Fuel-safety guard off: no cell is held under load.';
  if (heldCount === 0) return 'No cell held under load.';
  return heldCount === 1
    ? '1 cell held under load: needs data.'
    : `${heldCount} cells held under load: need data.`;
}

/** How the cells of a preview got their values, in one line (kinds with no cell left out). */
export function originLine(counts: OriginCounts): string {
  const parts: string[] = [
    `${counts.measured} measured`,
    `${counts.filled} filled from neighbours`,
  ];
  if (counts.held > 0) parts.push(`${counts.held} held`);
  if (counts.locked > 0) parts.push(`${counts.locked} locked`);
  parts.push(`${counts.unchanged} unchanged`);
  return `Cells: ${parts.join(', ')}.`;
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
