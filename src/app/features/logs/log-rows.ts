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
