import type { Channel } from '../core/channels';
import {
  CHANNEL_PATTERNS,
  MIXTURE_NAME_UNITS,
  normaliseColumnName,
  SUFFIX_UNITS,
  type ChannelPattern,
} from './channel-patterns';
import {
  CHANNEL_UNITS,
  type ChannelMapping,
  type ChannelUnit,
  type ColumnMapping,
} from './column-mapping';
import { parseDecimal } from './parse-decimal';
import { parseUnitText, type UnitReading } from './parse-unit-text';
import type { CsvSniff, SniffedColumn } from './sniff-csv';
import { unitFromValues } from './unit-from-values';

/**
 * Where a suggested unit came from, most to least reliable: the header's brackets or the units
 * row, a unit word ending the name, a word of the name (`Cmd Phi`), the logged values, or the
 * channel's canonical unit by default. `none`: the channel has no unit.
 */
export type UnitSource = 'header' | 'suffix' | 'name' | 'values' | 'default' | 'none';

/** How much each unit source is trusted, multiplied into a channel's confidence. */
const UNIT_SOURCE_TRUST: Readonly<Record<UnitSource, number>> = {
  header: 1,
  suffix: 0.95,
  name: 0.9,
  values: 0.75,
  default: 0.6,
  none: 1,
};

/** One channel of a suggestion: the column, its unit and how sure the suggestion is. */
export interface ChannelSuggestion {
  /** The column's header text. */
  readonly column: string;
  /** The column's position, from 0. */
  readonly index: number;
  /** The unit, for channels that have one. */
  readonly unit?: ChannelUnit;
  /** Where the unit came from. */
  readonly unitSource: UnitSource;
  /** 0–1: how sure the name match is, times how reliable the unit source is. */
  readonly confidence: number;
}

/** A suggested mapping (the API's shape), with a confidence per channel and what is missing. */
export interface MappingSuggestion {
  /** The mapping, ready to apply or to show for review. */
  readonly mapping: ColumnMapping;
  /** Per mapped channel: column, unit and confidence. */
  readonly channels: Readonly<Partial<Record<Channel, ChannelSuggestion>>>;
  /** Required channels that no column supplies (`map` when neither MAP nor boost is found). */
  readonly missing: readonly string[];
  /** Columns no channel took, in file order. */
  readonly unmatchedColumns: readonly string[];
}

/** Options of {@link suggestMapping}. */
export interface SuggestOptions {
  /** A barometric pressure (kPa) to use with gauge boost when the file logs none. */
  readonly defaultBaroKpa?: number;
  /** Below this confidence a candidate is not suggested (0–1, default 0.3). */
  readonly minConfidence?: number;
}

interface Candidate extends ChannelSuggestion {
  readonly channel: Channel;
}

function isUnitAllowed(channel: Channel, reading: UnitReading): boolean {
  const allowed = CHANNEL_UNITS[channel];
  if (allowed.length === 0) return reading.unit === 'flag';
  if (reading.unit === 'flag' || !allowed.includes(reading.unit)) return false;
  // A gauge reading is never MAP or baro, an absolute one never boost.
  if (channel === 'boost') return reading.reference !== 'absolute';
  if (channel === 'map' || channel === 'baro') return reading.reference !== 'gauge';
  return true;
}

function sampleValues(sniff: CsvSniff, index: number): number[] {
  return sniff.sampleRows
    .map((row) => parseDecimal(row[index] ?? '', sniff.decimal))
    .filter(Number.isFinite);
}

/**
 * The unit of a (column, pattern) pair, or null when the column's stated unit rules the
 * pattern out (a voltage in a MAP column, absolute pressure in a boost column).
 */
function resolveUnit(
  column: SniffedColumn,
  words: string,
  pattern: ChannelPattern,
  sniff: CsvSniff,
): { unit?: ChannelUnit; unitSource: UnitSource } | null {
  const { channel } = pattern;
  const allowed = CHANNEL_UNITS[channel];
  const canonical = allowed[0];
  const stated = column.unit === null ? null : parseUnitText(column.unit);
  if (pattern.requires && stated?.reference !== pattern.requires) return null;
  if (column.unit !== null && stated === null) {
    // Unknown unit text: harmless on 0/1 channels and single-unit channels, fatal where the unit
    // decides a conversion.
    if (allowed.length > 1) return null;
  } else if (stated !== null) {
    if (!isUnitAllowed(channel, stated)) return null;
    return canonical === undefined
      ? { unitSource: 'none' }
      : { unit: stated.unit as ChannelUnit, unitSource: 'header' };
  }
  if (canonical === undefined) return { unitSource: 'none' };
  const tokens = words.split(' ');
  const last = tokens[tokens.length - 1] as string;
  const suffix = tokens.length > 1 && SUFFIX_UNITS.has(last) ? parseUnitText(last) : null;
  if (suffix && isUnitAllowed(channel, suffix))
    return { unit: suffix.unit as ChannelUnit, unitSource: 'suffix' };
  if (allowed.length === 1) return { unit: canonical, unitSource: 'default' };
  if (channel === 'lambda' || channel === 'lambdaTarget') {
    const named = MIXTURE_NAME_UNITS.find(([re]) => re.test(words));
    if (named) return { unit: named[1], unitSource: 'name' };
  }
  const fromValues = unitFromValues(channel, sampleValues(sniff, column.index));
  if (fromValues) return { unit: fromValues, unitSource: 'values' };
  return { unit: canonical, unitSource: 'default' };
}

function candidatesFor(column: SniffedColumn, sniff: CsvSniff): Candidate[] {
  const words = normaliseColumnName(column.name);
  if (words === '') return [];
  const best = new Map<Channel, Candidate>();
  for (const pattern of CHANNEL_PATTERNS) {
    if (!pattern.match.test(words) || pattern.exclude?.test(words)) continue;
    const unit = resolveUnit(column, words, pattern, sniff);
    if (!unit) continue;
    const confidence = pattern.strength * UNIT_SOURCE_TRUST[unit.unitSource];
    const previous = best.get(pattern.channel);
    if (previous && previous.confidence >= confidence) continue;
    best.set(pattern.channel, {
      channel: pattern.channel,
      column: column.name,
      index: column.index,
      ...unit,
      confidence: Math.round(confidence * 1000) / 1000,
    });
  }
  return [...best.values()];
}

function missingChannels(
  chosen: Partial<Record<Channel, ChannelSuggestion>>,
  options: SuggestOptions,
): string[] {
  const missing: string[] = (['time', 'rpm'] as const).filter((c) => !chosen[c]);
  if (!chosen.map) {
    if (!chosen.boost) missing.push('map');
    else if (!chosen.baro && options.defaultBaroKpa === undefined) missing.push('baro');
  }
  for (const c of ['lambda', 'lambdaTarget'] as const) if (!chosen[c]) missing.push(c);
  return missing;
}

/**
 * Suggests which column holds each canonical channel, and in which unit, from the names and
 * units the sniffer found (several naming styles; see `channel-patterns.ts`). Each column goes
 * to at most one channel and each channel to its most confident column. Required channels no
 * column supplies are listed in `missing`; the caller refuses the file when that is not empty.
 */
export function suggestMapping(sniff: CsvSniff, options: SuggestOptions = {}): MappingSuggestion {
  if (!sniff || !Array.isArray(sniff.columns))
    throw new Error('suggestMapping: sniff.columns must be an array');
  const { defaultBaroKpa, minConfidence = 0.3 } = options;
  if (defaultBaroKpa !== undefined && !(defaultBaroKpa > 0 && Number.isFinite(defaultBaroKpa))) {
    throw new Error('suggestMapping: options.defaultBaroKpa must be a positive number of kPa');
  }
  const candidates = sniff.columns
    .flatMap((column) => candidatesFor(column, sniff))
    .filter((c) => c.confidence >= minConfidence)
    // Most confident first; on a tie the earlier column wins, so the result is stable.
    .sort((a, b) => b.confidence - a.confidence || a.index - b.index);
  const chosen: Partial<Record<Channel, ChannelSuggestion>> = {};
  const takenColumns = new Set<number>();
  for (const { channel, ...suggestion } of candidates) {
    if (chosen[channel] || takenColumns.has(suggestion.index)) continue;
    chosen[channel] = suggestion;
    takenColumns.add(suggestion.index);
  }
  const channels: Partial<Record<Channel, ChannelMapping>> = {};
  for (const [channel, s] of Object.entries(chosen) as [Channel, ChannelSuggestion][]) {
    const hasUnitChoice = CHANNEL_UNITS[channel].length > 1;
    channels[channel] =
      hasUnitChoice && s.unit ? { column: s.column, unit: s.unit } : { column: s.column };
  }
  return {
    mapping: {
      headerRow: sniff.headerRow,
      unitsRow: sniff.unitsRow,
      delimiter: sniff.delimiter,
      decimal: sniff.decimal,
      channels,
    },
    channels: chosen,
    missing: missingChannels(chosen, options),
    unmatchedColumns: sniff.columns
      .filter((c) => !takenColumns.has(c.index) && c.name !== '')
      .map((c) => c.name),
  };
}

/**
 * A stable text that identifies a header whatever the column order, spacing or letter case:
 * the normalised column names (units kept), sorted, joined by `|`. Presets are found by it.
 */
export function headerSignature(columns: readonly Pick<SniffedColumn, 'name'>[]): string {
  if (!Array.isArray(columns)) throw new Error('headerSignature: columns must be an array');
  const names = columns
    .map((c) => c.name.trim().toLowerCase().replace(/\s+/g, ' ').replace(/\|/g, '/'))
    .filter((n) => n !== '');
  return [...new Set(names)].sort().join('|');
}
