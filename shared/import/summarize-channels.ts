import type { Channel, ColumnarLog } from '../core/channels';

/** Figures of one channel over a log; NaN values are counted and left out of the others. */
export interface ChannelSummary {
  /** Smallest value (NaN when the channel holds no number). */
  readonly min: number;
  /** Largest value (NaN when the channel holds no number). */
  readonly max: number;
  /** Mean of the values (NaN when the channel holds no number). */
  readonly mean: number;
  /** How many samples are NaN. */
  readonly nanCount: number;
}

/** Per channel present in `log`: min, max, mean and the count of missing (NaN) samples. */
export function summarizeChannels(log: ColumnarLog): Partial<Record<Channel, ChannelSummary>> {
  if (!log || typeof log.channels !== 'object') {
    throw new Error('summarizeChannels: log must be a ColumnarLog');
  }
  const out: Partial<Record<Channel, ChannelSummary>> = {};
  for (const [channel, data] of Object.entries(log.channels) as [Channel, Float64Array][]) {
    let min = Infinity;
    let max = -Infinity;
    let sum = 0;
    let count = 0;
    for (let i = 0; i < data.length; i++) {
      const v = data[i] as number;
      if (Number.isNaN(v)) continue;
      if (v < min) min = v;
      if (v > max) max = v;
      sum += v;
      count++;
    }
    out[channel] =
      count === 0
        ? { min: NaN, max: NaN, mean: NaN, nanCount: data.length }
        : { min, max, mean: sum / count, nanCount: data.length - count };
  }
  return out;
}
