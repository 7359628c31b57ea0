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
  /**
   * For the channels asked for: the values at every tenth of a percent of the samples (1001
   * figures, from the smallest to the largest), so the share of a log beyond any table's axes can
   * be told later without reading the samples again. Taken over at most 200 000 evenly spaced
   * samples: the share is then good to about 0.2 %.
   */
  readonly permille?: readonly number[];
}

/** Most samples the per-mille figures are taken over. */
const PERMILLE_SAMPLES = 200_000;

/** The values at 0, 0.1 … 100 % of the numbers in `data` (none: undefined). */
function permilleOf(data: Float64Array): number[] | undefined {
  const stride = Math.max(1, Math.ceil(data.length / PERMILLE_SAMPLES));
  const picked: number[] = [];
  for (let i = 0; i < data.length; i += stride) {
    const v = data[i] as number;
    if (!Number.isNaN(v)) picked.push(v);
  }
  if (picked.length === 0) return undefined;
  const sorted = Float64Array.from(picked).sort();
  const out: number[] = [];
  for (let m = 0; m <= 1000; m++) {
    out.push(sorted[Math.round((m / 1000) * (sorted.length - 1))] as number);
  }
  return out;
}

/**
 * The share (0–1) of a channel's samples above `limit`, from its per-mille figures: 0 when the
 * largest is at or below it. Good to the figures' resolution (0.1 %).
 */
export function shareAbove(permille: readonly number[], limit: number): number {
  if (permille.length < 2) throw new Error('shareAbove: give the per-mille figures');
  if (!((permille[permille.length - 1] as number) > limit)) return 0;
  let atOrBelow = 0;
  for (const v of permille) if (v <= limit) atOrBelow++;
  return Math.max(0, Math.min(1, 1 - atOrBelow / permille.length));
}

/**
 * Per channel present in `log`: min, max, mean and the count of missing (NaN) samples; for the
 * channels in `permilleChannels` also the per-mille figures (see `ChannelSummary.permille`).
 */
export function summarizeChannels(
  log: ColumnarLog,
  permilleChannels: readonly Channel[] = [],
): Partial<Record<Channel, ChannelSummary>> {
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
    const permille = permilleChannels.includes(channel) ? permilleOf(data) : undefined;
    out[channel] =
      count === 0
        ? { min: NaN, max: NaN, mean: NaN, nanCount: data.length }
        : {
            min,
            max,
            mean: sum / count,
            nanCount: data.length - count,
            ...(permille && { permille }),
          };
  }
  return out;
}
