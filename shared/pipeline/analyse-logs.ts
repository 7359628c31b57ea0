import { accumulateCells, type CellStats } from '../accumulate';
import type { LambdaDelayEstimate } from '../align';
import { requireChannel, type ColumnarLog } from '../core/channels';
import { tableToGrid, validateTable, type VeTable } from '../core/table';
import { flagLeanCells, proposeTable, type LeanFlag, type Proposal } from '../correct';
import { DEFAULT_FILTER_RULES, type FilterRule, type FunnelStep } from '../filter';
import { estimateBaro, type BaroEstimate } from './estimate-baro';
import { prepareLog } from './prepare-log';

/** One log to analyse, with the table the ECU ran when it was recorded. */
export interface AnalysisLog {
  /** The log in canonical units. */
  readonly log: ColumnarLog;
  /**
   * The VE table the ECU ran when the log was recorded (its revision). Absent: the base table.
   * Corrections are relative to it, so logs of several revisions combine correctly.
   */
  readonly ecuTable?: VeTable;
}

/** The wideband delay to use: fixed figures, or the log's own estimate when it is trustworthy. */
export interface DelaySettings {
  /** Fixed part τ₀, s. Default 0.1 (reference.md §6, common practice). */
  readonly tau0S?: number;
  /** Flow part K, grams (τ = τ₀ + K/ṁ). Default 1. */
  readonly kGrams?: number;
  /** Whether to estimate τ₀ and K from each log and use the estimate when not `poor`. Default true. */
  readonly estimate?: boolean;
}

/** Settings of an analysis; every field has a sound default. */
export interface AnalysisSettings {
  /** Wideband delay. */
  readonly delay?: DelaySettings;
  /** Filter rules in order. Default `DEFAULT_FILTER_RULES`. */
  readonly filters?: readonly FilterRule[];
  /** Fraction of the correction the proposal applies, (0, 1]. Default 0.5. */
  readonly stepFraction?: number;
  /** Largest change of a cell in one round, %. Default 15. */
  readonly maxStepPercent?: number;
  /** Least weight before a cell is trusted. Default 5. */
  readonly minWeight?: number;
  /** Largest spread of the ratio a trusted cell may have (fraction). Default none. */
  readonly maxSpread?: number;
  /** MAP at or above which lean readings count as "under load", kPa. Default 90. */
  readonly leanLoadKpa?: number;
  /** Lean error that raises a warning, %. Default 5. */
  readonly warnLeanPercent?: number;
}

/** What one log contributed. */
export interface LogContribution {
  /** Samples in the log. */
  readonly samples: number;
  /** Samples left after the filters. */
  readonly kept: number;
  /** Samples removed by each filter rule, in order. */
  readonly funnel: readonly FunnelStep[];
  /** The log's own delay estimate (null when estimation was off). */
  readonly delayEstimate: LambdaDelayEstimate | null;
  /** The delay that was applied. */
  readonly delayUsed: {
    readonly tau0S: number;
    readonly kGrams: number;
    readonly source: 'estimate' | 'settings';
  };
}

/** The result of an analysis: per-cell evidence, the proposal, the funnel and the delay. */
export interface Analysis {
  /** Per-cell statistics over all logs, relative to the base table. */
  readonly cells: CellStats;
  /** The proposal at the analysis's step fraction. */
  readonly proposal: Proposal;
  /** Cells measured leaner than commanded under load. */
  readonly leanFlags: readonly LeanFlag[];
  /** Per-log details, in input order. */
  readonly logs: readonly LogContribution[];
  /** The barometric pressure the logs were recorded at (the fuel-safety guard's reference). */
  readonly baro: BaroEstimate;
}

/** Engine facts the analysis needs. */
export interface AnalysisEngine {
  /** Displacement, litres: for the airflow behind the delay. */
  readonly displacementL: number;
}

function concat(parts: readonly Float64Array[]): Float64Array {
  const out = new Float64Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const part of parts) {
    out.set(part, at);
    at += part.length;
  }
  return out;
}

function optionalChannel(log: ColumnarLog, channel: 'stft' | 'ltft'): Float64Array {
  return log.channels[channel] ?? new Float64Array(log.length);
}

/**
 * Runs align → filter → accumulate → propose over one or more logs against a base revision.
 * Each log's lambda is shifted by its wideband delay (its own estimate when that is at least
 * `fair`, else the settings), filtered by the rules in order, and every kept sample's correction
 * is re-expressed against the base table when the log was recorded on another revision.
 */
export function analyseLogs(
  base: VeTable,
  logs: readonly AnalysisLog[],
  engine: AnalysisEngine,
  settings: AnalysisSettings = {},
): Analysis {
  validateTable(base, 'base');
  if (logs.length === 0) throw new Error('analyseLogs: give at least one log');
  const baseGrid = tableToGrid(base);
  const delay = settings.delay ?? {};
  const rules = settings.filters ?? DEFAULT_FILTER_RULES;
  const parts = {
    rpm: [],
    map: [],
    lambda: [],
    target: [],
    stft: [],
    ltft: [],
    veUsed: [],
  } as Record<'rpm' | 'map' | 'lambda' | 'target' | 'stft' | 'ltft' | 'veUsed', Float64Array[]>;
  const keepParts: Uint8Array[] = [];
  const contributions: LogContribution[] = [];

  for (const [index, item] of logs.entries()) {
    const { log } = item;
    if (log.length === 0) throw new Error(`analyseLogs: log ${index} has no samples`);
    const rawRpm = requireChannel(log, 'rpm');
    const rawMap = requireChannel(log, 'map');
    const prepared = prepareLog(log, {
      ecuTable: item.ecuTable ?? base,
      displacementL: engine.displacementL,
      delay,
      rules,
    });
    const { veUsed, aligned } = prepared;
    parts.rpm.push(rawRpm);
    parts.map.push(rawMap);
    parts.lambda.push(requireChannel(aligned, 'lambda'));
    parts.target.push(requireChannel(aligned, 'lambdaTarget'));
    parts.stft.push(optionalChannel(aligned, 'stft'));
    parts.ltft.push(optionalChannel(aligned, 'ltft'));
    parts.veUsed.push(veUsed);
    keepParts.push(prepared.keep);
    contributions.push({
      samples: log.length,
      kept: prepared.keep.reduce((n, k) => n + (k ? 1 : 0), 0),
      funnel: prepared.funnel,
      delayEstimate: prepared.delayEstimate,
      delayUsed: prepared.delayUsed,
    });
  }

  const keep = new Uint8Array(keepParts.reduce((n, k) => n + k.length, 0));
  let at = 0;
  for (const part of keepParts) {
    keep.set(part, at);
    at += part.length;
  }
  const cells = accumulateCells(
    {
      rpmAxis: base.rpmAxis,
      mapAxisKpa: base.mapAxisKpa,
      rpm: concat(parts.rpm),
      mapKpa: concat(parts.map),
      lambda: concat(parts.lambda),
      lambdaTarget: concat(parts.target),
      stft: concat(parts.stft),
      ltft: concat(parts.ltft),
      keep,
      veUsed: concat(parts.veUsed),
      veEditing: baseGrid,
    },
    { leanLoadKpa: settings.leanLoadKpa },
  );
  const proposal = proposeTable(baseGrid, cells, {
    stepFraction: settings.stepFraction,
    maxStepPercent: settings.maxStepPercent,
    minWeight: settings.minWeight,
    maxSpread: settings.maxSpread,
  });
  const leanFlags = flagLeanCells(cells, {
    warnLeanPercent: settings.warnLeanPercent,
    minLoadKpa: settings.leanLoadKpa,
    minWeight: settings.minWeight,
  });
  const baro = estimateBaro(logs.map((item) => item.log));
  return { cells, proposal, leanFlags, logs: contributions, baro };
}
