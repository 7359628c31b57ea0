import type { Channel } from '../core/channels';
import {
  channelConverter,
  FLAG_CHANNELS,
  isIdentityConverter,
  type ValueConverter,
} from './channel-converter';
import type { ColumnMapping } from './column-mapping';
import { ImportError } from './import-error';

/** Options of `createLogBuilder` (log-builder.ts). */
export interface LogBuilderOptions {
  /** The fuel's stoichiometric AFR, to turn AFR columns into lambda. */
  readonly stoichAfr: number;
  /** Barometric pressure (kPa) for gauge boost when the file logs none (or a cell is empty). */
  readonly baroKpa?: number;
  /** The header's column names, when the rows pushed start below the header. */
  readonly columns?: readonly string[];
  /** How many problems to keep in detail (default 1000); all are counted. */
  readonly maxProblems?: number;
  /** Above this share of dropped rows the file is flagged mostly bad (default 0.5). */
  readonly mostlyBadFraction?: number;
}

/** One mapped column as the builder reads it. */
export interface LogInput {
  /** The channel it feeds (boost before it is folded into MAP). */
  readonly channel: Channel;
  /** The column's header text, for problem reports. */
  readonly column: string;
  /** The column's index in each row. */
  readonly index: number;
  /** To the channel's canonical unit. */
  readonly convert: ValueConverter;
  /** Whether `convert` keeps values as they are (the column is in the canonical unit). */
  readonly isIdentity: boolean;
  /** Whether a row without a readable value here is dropped. */
  readonly isRequired: boolean;
  /** Whether the channel is a 0/1 flag (words such as `on` allowed). */
  readonly isFlag: boolean;
}

const REQUIRED_INPUTS: ReadonlySet<Channel> = new Set([
  'time',
  'rpm',
  'map',
  'boost',
  'lambda',
  'lambdaTarget',
]);

/** Throws naming the option unless the builder's options are usable. */
export function validateLogBuilderOptions(options: LogBuilderOptions): void {
  const { stoichAfr, baroKpa, maxProblems, mostlyBadFraction } = options;
  if (!(stoichAfr > 0 && Number.isFinite(stoichAfr))) {
    throw new Error('createLogBuilder: options.stoichAfr must be a positive number');
  }
  if (baroKpa !== undefined && !(baroKpa > 0 && Number.isFinite(baroKpa))) {
    throw new Error('createLogBuilder: options.baroKpa must be a positive number of kPa');
  }
  if (maxProblems !== undefined && !(Number.isInteger(maxProblems) && maxProblems >= 0)) {
    throw new Error('createLogBuilder: options.maxProblems must be an integer ≥ 0');
  }
  if (mostlyBadFraction !== undefined && !(mostlyBadFraction >= 0 && mostlyBadFraction <= 1)) {
    throw new Error('createLogBuilder: options.mostlyBadFraction must be within 0–1');
  }
}

/** The channels a mapping feeds, boost left out when MAP is there; throws on missing ones. */
export function channelsToRead(mapping: ColumnMapping, options: LogBuilderOptions): Channel[] {
  const mapped = (Object.keys(mapping.channels) as Channel[]).filter((c) => mapping.channels[c]);
  const has = (c: Channel): boolean => mapped.includes(c);
  const missing: string[] = (['time', 'rpm'] as const).filter((c) => !has(c));
  if (!has('map') && !has('boost')) missing.push('map');
  if (!has('map') && has('boost') && !has('baro') && options.baroKpa === undefined)
    missing.push('baro');
  missing.push(...(['lambda', 'lambdaTarget'] as const).filter((c) => !has(c)));
  if (missing.length > 0) {
    throw new ImportError(
      'missing_channels',
      `required channels not mapped: ${missing.join(', ')}`,
      { missing },
    );
  }
  return has('map') ? mapped.filter((c) => c !== 'boost') : mapped;
}

function findColumn(header: readonly string[], name: string): number {
  const exact = header.findIndex((h) => h.trim() === name.trim());
  if (exact >= 0) return exact;
  const folded = name.trim().toLowerCase();
  return header.findIndex((h) => h.trim().toLowerCase() === folded);
}

/**
 * The inputs of `channels` found in `header`; throws an ImportError naming the mapped columns
 * the header lacks.
 */
export function resolveLogInputs(
  header: readonly string[],
  channels: readonly Channel[],
  mapping: ColumnMapping,
  options: LogBuilderOptions,
): LogInput[] {
  const isBaroRequired = channels.includes('boost') && options.baroKpa === undefined;
  const resolved = channels.map((channel): LogInput => {
    const entry = mapping.channels[channel];
    const column = entry?.column ?? '';
    const convert = channelConverter(channel, entry?.unit, options.stoichAfr);
    return {
      channel,
      column,
      index: findColumn(header, column),
      convert,
      isIdentity: isIdentityConverter(convert),
      isRequired: REQUIRED_INPUTS.has(channel) || (channel === 'baro' && isBaroRequired),
      isFlag: FLAG_CHANNELS.has(channel),
    };
  });
  const unknown = resolved.filter((i) => i.index < 0).map((i) => i.column);
  if (unknown.length > 0) {
    throw new ImportError(
      'unknown_column',
      `mapped columns not in the header: ${unknown.join(', ')}`,
      { missing: unknown, row: mapping.headerRow },
    );
  }
  return resolved;
}
