import { CHANNELS, type Channel } from '../core/channels';
import {
  MIXTURE_UNITS,
  PRESSURE_UNITS,
  SPEED_UNITS,
  TEMPERATURE_UNITS,
  TIME_UNITS,
  type MixtureUnit,
  type PressureUnit,
  type SpeedUnit,
  type TemperatureUnit,
  type TimeUnit,
} from '../units';
import { ImportError } from './import-error';

/** Units a mapped column may be given in (the API's spelling). */
export type ChannelUnit =
  TimeUnit | PressureUnit | MixtureUnit | TemperatureUnit | SpeedUnit | '%' | 'rpm' | 'deg';

/** The CSV delimiters the importer reads. */
export const DELIMITERS = [',', ';', '\t', '|'] as const;
/** One CSV delimiter. */
export type Delimiter = (typeof DELIMITERS)[number];

/** The line breaks the importer reads. */
export type Newline = '\r\n' | '\n' | '\r';

/** The decimal marks the importer reads. */
export type DecimalMark = '.' | ',';

/** Where one canonical channel comes from: a CSV column (by its header text) and its unit. */
export interface ChannelMapping {
  /** The column's header text, exactly as in the file. */
  readonly column: string;
  /** The column's unit; absent means the channel's canonical unit. */
  readonly unit?: ChannelUnit;
}

/**
 * How to read a CSV file (the API's mapping shape). Every field but `channels` may be absent and
 * is then detected. Row numbers count lines from 0.
 */
export interface ColumnMapping {
  /** The line holding the column names. */
  readonly headerRow?: number;
  /** The line holding the column units, or null when the file has none. */
  readonly unitsRow?: number | null;
  /** The field delimiter. */
  readonly delimiter?: Delimiter;
  /** The decimal mark of numbers. */
  readonly decimal?: DecimalMark;
  /** Canonical channel → column. */
  readonly channels: Readonly<Partial<Record<Channel, ChannelMapping>>>;
}

/** The units each channel accepts; the first is its canonical unit. Empty: no unit applies. */
export const CHANNEL_UNITS: Readonly<Record<Channel, readonly ChannelUnit[]>> = {
  time: TIME_UNITS,
  rpm: ['rpm'],
  map: PRESSURE_UNITS,
  boost: PRESSURE_UNITS,
  baro: PRESSURE_UNITS,
  lambda: MIXTURE_UNITS,
  lambdaTarget: MIXTURE_UNITS,
  iat: TEMPERATURE_UNITS,
  ect: TEMPERATURE_UNITS,
  tps: ['%'],
  stft: ['%'],
  ltft: ['%'],
  gear: [],
  speed: SPEED_UNITS,
  closedLoop: [],
  fuelCut: [],
  knock: ['deg'],
  injDuty: ['%'],
};

/** Whether `channel` is one of the canonical channels. */
export function isChannel(channel: string): channel is Channel {
  return (CHANNELS as readonly string[]).includes(channel);
}

/**
 * Throws an {@link ImportError} (`invalid_mapping`, naming the field) unless `mapping` is
 * well-formed: known channels, a column name for each, units the channel accepts, valid rows.
 */
export function validateMapping(mapping: ColumnMapping): void {
  const fail = (field: string, message: string): never => {
    throw new ImportError('invalid_mapping', `mapping.${field} ${message}`, { field });
  };
  if (typeof mapping !== 'object' || mapping === null) fail('', 'must be an object');
  const { headerRow, unitsRow, delimiter, decimal, channels } = mapping;
  if (headerRow !== undefined && !(Number.isInteger(headerRow) && headerRow >= 0)) {
    fail('headerRow', 'must be an integer ≥ 0');
  }
  if (unitsRow !== undefined && unitsRow !== null) {
    if (!(Number.isInteger(unitsRow) && unitsRow >= 0)) fail('unitsRow', 'must be an integer ≥ 0');
    if (unitsRow === headerRow) fail('unitsRow', 'must differ from headerRow');
  }
  if (delimiter !== undefined && !(DELIMITERS as readonly string[]).includes(delimiter)) {
    fail('delimiter', `must be one of ${DELIMITERS.map((d) => JSON.stringify(d)).join(', ')}`);
  }
  if (decimal !== undefined && decimal !== '.' && decimal !== ',') {
    fail('decimal', 'must be "." or ","');
  }
  if (decimal === ',' && delimiter === ',') fail('decimal', 'cannot be "," when delimiter is ","');
  if (typeof channels !== 'object' || channels === null) fail('channels', 'must be an object');
  for (const [channel, entry] of Object.entries(channels)) {
    if (!isChannel(channel)) fail(`channels.${channel}`, 'is not a known channel');
    if (entry === undefined) continue;
    if (typeof entry.column !== 'string' || entry.column === '') {
      fail(`channels.${channel}.column`, 'must be a non-empty column name');
    }
    const allowed = CHANNEL_UNITS[channel as Channel];
    if (entry.unit !== undefined && !allowed.includes(entry.unit)) {
      const list = allowed.length > 0 ? allowed.join(', ') : 'none';
      fail(`channels.${channel}.unit`, `must be one of: ${list}`);
    }
  }
}
