/**
 * Downsampling of a long time series for a chart: the samples of a time window are put into
 * buckets of equal duration, and each bucket keeps the lowest, the highest and the mean value of
 * every channel. Keeping the envelope (not one sample per bucket, nor the mean alone) lets a
 * one-sample lean spike survive zooming out, which is what a tuner looks for. A window that
 * holds no more samples than buckets is returned sample by sample, unchanged.
 */

/** Per bucket: the lowest, highest and mean finite value; null where the bucket has none. */
export interface ChannelEnvelope {
  /** Lowest value of each bucket. */
  readonly min: (number | null)[];
  /** Highest value of each bucket. */
  readonly max: (number | null)[];
  /** Mean value of each bucket. */
  readonly mean: (number | null)[];
}

/** What {@link bucketSeries} works on: a time channel, the channels to bucket, a keep mask. */
export interface SeriesInput<K extends string> {
  /** Sample times, seconds, ascending (equal neighbours allowed). */
  readonly time: Float64Array;
  /** The channels, each as long as `time`; NaN is a missing value. */
  readonly channels: Readonly<Record<K, Float64Array>>;
  /** 1 for each sample a filter kept, 0 for each it removed; absent when there is no filter. */
  readonly keep?: Uint8Array | null;
}

/** Options of {@link bucketSeries}. */
export interface BucketSeriesOptions {
  /** Most buckets to return, a whole number ≥ 1. */
  readonly points: number;
  /** Start of the window, seconds; default (and at least) the first sample's time. */
  readonly fromS?: number;
  /** End of the window, seconds; default (and at most) the last sample's time. */
  readonly toS?: number;
}

/** A bucketed window of a series. */
export interface BucketedSeries<K extends string> {
  /** Each bucket's time: its middle, or the sample's own time when unbucketed. */
  readonly timeS: number[];
  /** Each channel's envelope per bucket. */
  readonly channels: Record<K, ChannelEnvelope>;
  /** Per bucket the fraction 0–1 of its samples kept (null for an empty bucket); null without a mask. */
  readonly kept: (number | null)[] | null;
  /** The window actually used, seconds: the request clipped to the series. */
  readonly rangeS: [number, number];
  /** Samples inside the window. */
  readonly sampleCount: number;
  /** Whether every bucket is one sample (the window holds no more samples than `points`). */
  readonly isExact: boolean;
}

/** The index range `[first, end)` of the samples inside a window, and the window clipped. */
export interface SeriesWindow {
  /** First sample at or after the window's start. */
  readonly first: number;
  /** One past the last sample at or before the window's end. */
  readonly end: number;
  /** The window's start, seconds, clipped to the series. */
  readonly startS: number;
  /** The window's end, seconds, clipped to the series. */
  readonly endS: number;
}

/** First index whose time is ≥ `t` (or, with `isAfter`, > `t`); binary search on ascending times. */
function lowerBound(time: Float64Array, t: number, isAfter: boolean): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    const isBefore = isAfter ? time[mid] <= t : time[mid] < t;
    if (isBefore) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The samples of `time` inside `[fromS, toS]`, the window clipped to the series; null when the
 * window and the series do not overlap. Throws naming the argument for a bad window.
 */
export function seriesWindow(
  time: Float64Array,
  fromS?: number,
  toS?: number,
): SeriesWindow | null {
  if (!(time instanceof Float64Array)) throw new Error('seriesWindow: time must be a Float64Array');
  if (fromS !== undefined && !Number.isFinite(fromS)) {
    throw new Error('seriesWindow: fromS must be a finite number of seconds');
  }
  if (toS !== undefined && !Number.isFinite(toS)) {
    throw new Error('seriesWindow: toS must be a finite number of seconds');
  }
  if (fromS !== undefined && toS !== undefined && !(toS > fromS)) {
    throw new Error('seriesWindow: toS must be later than fromS');
  }
  if (time.length === 0) return null;
  const firstS = time[0];
  const lastS = time[time.length - 1];
  const startS = Math.max(fromS ?? firstS, firstS);
  const endS = Math.min(toS ?? lastS, lastS);
  if (startS > endS) return null;
  return {
    first: lowerBound(time, startS, false),
    end: lowerBound(time, endS, true),
    startS,
    endS,
  };
}

/** Running figures of one channel in one bucket. */
interface Tally {
  min: Float64Array;
  max: Float64Array;
  sum: Float64Array;
  count: Uint32Array;
}

function newTally(buckets: number): Tally {
  return {
    min: new Float64Array(buckets).fill(Infinity),
    max: new Float64Array(buckets).fill(-Infinity),
    sum: new Float64Array(buckets),
    count: new Uint32Array(buckets),
  };
}

function envelopeOf(tally: Tally): ChannelEnvelope {
  const min: (number | null)[] = [];
  const max: (number | null)[] = [];
  const mean: (number | null)[] = [];
  for (let k = 0; k < tally.count.length; k++) {
    const n = tally.count[k];
    min.push(n > 0 ? tally.min[k] : null);
    max.push(n > 0 ? tally.max[k] : null);
    mean.push(n > 0 ? tally.sum[k] / n : null);
  }
  return { min, max, mean };
}

function checkInput<K extends string>(input: SeriesInput<K>, points: number): void {
  const { time, channels, keep } = input;
  if (!(time instanceof Float64Array)) throw new Error('bucketSeries: time must be a Float64Array');
  for (const [name, values] of Object.entries<Float64Array>(channels)) {
    if (!(values instanceof Float64Array) || values.length !== time.length) {
      throw new Error(`bucketSeries: channel "${name}" must be a Float64Array as long as time`);
    }
  }
  if (keep && keep.length !== time.length) {
    throw new Error(`bucketSeries: keep has ${keep.length} samples, time ${time.length}`);
  }
  if (!Number.isInteger(points) || points < 1) {
    throw new Error('bucketSeries: points must be a whole number ≥ 1');
  }
}

/**
 * Buckets the window `[fromS, toS]` of a series into at most `points` buckets of equal duration
 * (see the file's comment). Every channel gets min, max and mean per bucket; NaN values are left
 * out of them, and a bucket with no finite value gets null. With a keep mask, `kept` is the share
 * of each bucket's samples the filter kept. Buckets without any sample stay in the result (all
 * null), so a gap in the log stays a gap on the chart. Throws naming the argument for bad input
 * or a window that does not overlap the series. The input is not changed.
 */
export function bucketSeries<K extends string>(
  input: SeriesInput<K>,
  options: BucketSeriesOptions,
): BucketedSeries<K> {
  const { points, fromS, toS } = options;
  checkInput(input, points);
  const { time, channels, keep } = input;
  const window = seriesWindow(time, fromS, toS);
  if (window === null) {
    throw new Error(
      time.length === 0
        ? 'bucketSeries: the series has no samples'
        : 'bucketSeries: the window does not overlap the series',
    );
  }
  const { first, end, startS, endS } = window;
  const sampleCount = end - first;
  const names = Object.keys(channels) as K[];
  const isExact = sampleCount <= points;
  const widthS = (endS - startS) / points;
  // Equal times throughout (width 0) leave nothing to spread: one bucket holds them all.
  const buckets = isExact ? sampleCount : widthS > 0 ? points : 1;
  const bucketOf = (i: number): number =>
    isExact
      ? i - first
      : widthS > 0
        ? Math.min(buckets - 1, Math.floor((time[i] - startS) / widthS))
        : 0;

  const tallies = new Map<K, Tally>(names.map((name) => [name, newTally(buckets)]));
  const samples = new Uint32Array(buckets);
  const keptCount = new Uint32Array(buckets);
  for (let i = first; i < end; i++) {
    const k = bucketOf(i);
    samples[k]++;
    if (keep && keep[i] === 1) keptCount[k]++;
    for (const name of names) {
      const value = channels[name][i];
      if (!Number.isFinite(value)) continue;
      const tally = tallies.get(name) as Tally;
      if (value < tally.min[k]) tally.min[k] = value;
      if (value > tally.max[k]) tally.max[k] = value;
      tally.sum[k] += value;
      tally.count[k]++;
    }
  }

  const timeS: number[] = [];
  const kept: (number | null)[] = [];
  for (let k = 0; k < buckets; k++) {
    timeS.push(isExact ? time[first + k] : widthS > 0 ? startS + (k + 0.5) * widthS : startS);
    kept.push(samples[k] > 0 ? keptCount[k] / samples[k] : null);
  }
  const envelopes = {} as Record<K, ChannelEnvelope>;
  for (const name of names) envelopes[name] = envelopeOf(tallies.get(name) as Tally);
  return {
    timeS,
    channels: envelopes,
    kept: keep ? kept : null,
    rangeS: [startS, endS],
    sampleCount,
    isExact,
  };
}
