import type { MixtureDisplay, UnitSystem } from '@shared/contracts/preferences';
import { type Quantity, toDisplay, unitLabel } from '../../ui/units/display-units';
import { CHANNELS, type Channel } from '@shared/core/channels';
import type { LogResource } from '@shared/contracts/logs';

/** One channel's figures as the API reports them. */
type ChannelSummary = NonNullable<LogResource['channelSummary']>[Channel] & object;

/** A log of the shop's list, with the label of its vehicle. */
export interface LogRow {
  /** The log. */
  log: LogResource;
  /** Its vehicle's label. */
  vehicleLabel: string;
}

/** Orders rows newest first (ISO timestamps compare as text), ties by id for a stable order. */
function newestFirst(a: LogRow, b: LogRow): number {
  if (a.log.createdAt !== b.log.createdAt) return a.log.createdAt < b.log.createdAt ? 1 : -1;
  return a.log.id < b.log.id ? 1 : -1;
}

/** The shop's logs across vehicles, newest first. */
export function mergeLogRows(
  perVehicle: readonly { vehicleLabel: string; logs: readonly LogResource[] }[],
): LogRow[] {
  return perVehicle
    .flatMap(({ vehicleLabel, logs }) => logs.map((log) => ({ log, vehicleLabel })))
    .sort(newestFirst);
}

/** The rows with `log` replaced in place, or added in date order when it is new. */
export function upsertLogRow(
  rows: readonly LogRow[],
  log: LogResource,
  vehicleLabel: string,
): LogRow[] {
  const others = rows.filter((row) => row.log.id !== log.id);
  return [...others, { log, vehicleLabel }].sort(newestFirst);
}

/** One mapped channel: where its values came from. */
export interface MappingRow {
  /** The canonical channel. */
  channel: Channel;
  /** The CSV column read for it. */
  column: string;
  /** The unit the column was read in, when stated. */
  unit: string | null;
}

/** One channel's figures, in canonical channel order. */
export interface SummaryRow extends ChannelSummary {
  /** The canonical channel. */
  channel: Channel;
}

/** The mapping's channels in canonical order. */
export function mappingRows(mapping: LogResource['mapping']): MappingRow[] {
  return CHANNELS.flatMap((channel) => {
    const entry = mapping.channels[channel];
    return entry === undefined ? [] : [{ channel, column: entry.column, unit: entry.unit ?? null }];
  });
}

/** The channel summary in canonical order; empty before parsing ends. */
export function summaryRows(summary: LogResource['channelSummary']): SummaryRow[] {
  if (summary === null) return [];
  return CHANNELS.flatMap((channel) => {
    const figures = summary[channel];
    return figures === undefined ? [] : [{ channel, ...figures }];
  });
}

/** A summary row in the user's units, with the unit it is shown in. */
export interface DisplaySummaryRow extends SummaryRow {
  /** The unit of min, max and mean as shown ("psi(a)", "°F", "AFR", …); empty for none. */
  unit: string;
}

/** Channels shown through a display quantity when the user prefers imperial. */
const CHANNEL_QUANTITY: Partial<Record<Channel, Quantity>> = {
  map: 'pressure',
  baro: 'pressure',
  iat: 'temperature',
  ect: 'temperature',
  speed: 'speed',
};

/** Readable canonical units for the channels that keep theirs. */
const KEPT_UNITS: Partial<Record<Channel, string>> = {
  time: 's',
  rpm: 'rpm',
  // Gauge pressure: not the absolute "psi(a)" of MAP, so it stays in kPa and says so.
  boost: 'kPa gauge',
  tps: '%',
  stft: '%',
  ltft: '%',
  knock: '°',
  injDuty: '%',
};

/**
 * The summary in the user's units: MAP and barometer in psi(a), temperatures in °F, speed in mph
 * for imperial; lambda channels as AFR with the vehicle's stoichiometric AFR when preferred (and
 * known). Figures stay metric and lambda otherwise; missing figures stay null.
 */
export function displaySummaryRows(
  rows: readonly SummaryRow[],
  units: UnitSystem,
  mixture: MixtureDisplay,
  stoichAfr: number | null,
): DisplaySummaryRow[] {
  return rows.map((row) => {
    const quantity = CHANNEL_QUANTITY[row.channel];
    const isMixture = row.channel === 'lambda' || row.channel === 'lambdaTarget';
    let convert = (value: number): number => value;
    let unit = KEPT_UNITS[row.channel] ?? '';
    if (quantity) {
      convert = (value) => toDisplay(quantity, value, units);
      unit = unitLabel(quantity, units);
    } else if (isMixture) {
      const isAfr = mixture === 'afr' && stoichAfr !== null;
      convert = (value) => (isAfr ? value * (stoichAfr as number) : value);
      unit = isAfr ? 'AFR' : 'λ';
    }
    const shown = (value: number | null) => (value === null ? null : convert(value));
    return { ...row, min: shown(row.min), max: shown(row.max), mean: shown(row.mean), unit };
  });
}
