/**
 * Fuel cut found from the log itself. On overrun fuel cut the wideband sees fresh air and its
 * controller reports the leanest value it can; that ceiling differs between controllers (λ 1.6
 * on some, about 1.36 on others), so a fixed "lambda ≥ 1.6" misses the cut on many logs and the
 * recovery after each cut stays in the data. This module finds the ceiling a log actually
 * shows (a plateau at its leanest readings, held on a closed throttle), the sensor's rise into
 * it, and the moment an overrun enters fuel cut (closed throttle above idle with lambda climbing
 * lean).
 *
 * Every threshold below is common practice, no published source [P]; each says why it holds.
 */
import { requireChannel, type ColumnarLog } from '../core/channels';
import { medianTimeStep, quantileWhere } from './order-statistics';

/**
 * Readings within 1.5 % under the ceiling count as at it. A pinned wideband still jitters by its
 * noise (about 0.4 % of the reading, 1σ, in our simulator) and by the controller's output
 * resolution (0.01 λ is 0.7 % at λ 1.36); 1.5 % holds nearly all of that and no more. [P]
 */
export const CEILING_BAND = 0.015;

/**
 * A plateau below λ 1.15 is no ceiling: engines cruise at λ ≤ about 1.05 and the controllers'
 * lean limits seen in logs lie at 1.25 and above, so 1.15 keeps the leanest cruise out and
 * every real ceiling in. [P]
 */
export const MIN_CEILING_LAMBDA = 1.15;

/**
 * Shortest stretch on the plateau that counts, s: five to eight sensor time constants (50–100 ms,
 * reference.md §6), so a lean spike the sensor passes through is not a plateau; 8 samples at
 * 20 Hz. [P]
 */
const MIN_RUN_S = 0.4;

/**
 * Least time on the plateau over the whole log, s: about one overrun's worth of cut, so one
 * lean moment cannot set the ceiling. [P]
 */
const MIN_PLATEAU_S = 1.5;

/** Dips below the band this short (noise on a pinned sensor) do not split a stretch, s. [P] */
const MAX_DIP_S = 0.15;

/**
 * The throttle counts as closed within 2 % of the log's lowest reading (its 1st percentile, taken
 * as at most 5 %, so a log that never closes the throttle does not call light cruise closed):
 * closed-throttle sensors read 0–3 % depending on their offset. [P]
 */
const CLOSED_TPS_MARGIN_PCT = 2;
const MAX_CLOSED_TPS_PCT = 5;

/** A stretch counts as overrun when the throttle is closed for at least half of it. [P] */
const MIN_CLOSED_SHARE = 0.5;

/**
 * Idle is the 10th percentile of engine speed with the throttle closed and the engine running,
 * and overrun is more than 300 rpm above it: fuel cut is enabled some 400–700 rpm above a warm
 * idle, and 300 rpm clears idle wander and most of a cold idle's lift. [P]
 */
const IDLE_QUANTILE = 0.1;
const IDLE_MARGIN_RPM = 300;

/**
 * Lambda climbing at 0.5 λ/s or faster and reaching the lean end within 0.5 s is the sensor's
 * rise into a cut: the reading runs from about 1 to a ceiling of 1.25–1.6 within a few sensor
 * time constants (well over 1 λ/s), while closed-loop wander and sensor noise stay far below
 * 0.5 λ/s once the rate is fitted over 0.3 s. The lean end is the log's ceiling, or λ 1.15
 * (`MIN_CEILING_LAMBDA`, leaner than an engine runs on purpose) for an overrun on a closed
 * throttle above idle; asking for it keeps out the gear change, where the throttle lifts and a
 * rich mixture climbs back towards λ 1 with fuel on. [P]
 */
const CLIMB_RATE_PER_S = 0.5;
const CLIMB_REACHES_LEAN_S = 0.5;

/**
 * Without a throttle channel a plateau must look like a clipped reading: piled up at its very
 * top (at least 40 % of its samples within 0.3 % of the ceiling) with next to nothing above it
 * (readings above it at most 5 % as many as on it: glitches). A held lean cruise is spread
 * around its mean: near its highest reading it puts well under 1 % of its samples within 0.3 %,
 * and any lower level that passes the first test has a third of the cruise above it. [P]
 */
const CLIP_TOP_REL = 0.003;
const MIN_CLIP_SHARE = 0.4;
const MAX_ABOVE_SHARE = 0.05;

/** The lean ceiling a log's wideband reports, as found by {@link detectLambdaCeiling}. */
export interface LambdaCeiling {
  /** The ceiling: the highest reading on the plateau, lambda. */
  readonly lambda: number;
  /** The lowest reading counted as at the ceiling: `lambda · (1 − CEILING_BAND)`. */
  readonly fromLambda: number;
  /** Time spent on the plateau in the stretches that count, s. */
  readonly plateauS: number;
  /** How many stretches on the plateau count. */
  readonly runs: number;
}

/**
 * 1 where the throttle is closed (within `CLOSED_TPS_MARGIN_PCT` of the log's lowest reading,
 * taken as at most `MAX_CLOSED_TPS_PCT`); 0 elsewhere and where the throttle is unknown.
 */
export function closedThrottleMask(tps: Float64Array): Uint8Array {
  const lowest = Math.min(quantileWhere(tps, 0.01), MAX_CLOSED_TPS_PCT);
  const out = new Uint8Array(tps.length);
  if (Number.isNaN(lowest)) return out;
  const limit = lowest + CLOSED_TPS_MARGIN_PCT;
  for (let i = 0; i < tps.length; i++) out[i] = tps[i] <= limit ? 1 : 0;
  return out;
}

/**
 * Finds the lean ceiling the log's wideband reports, or null when the log shows none. The
 * ceiling is the highest level at which the log holds a plateau: readings within `CEILING_BAND`
 * under it, in stretches of at least `MIN_RUN_S` (dips up to `MAX_DIP_S` bridged), adding up to
 * `MIN_PLATEAU_S`, at λ ≥ `MIN_CEILING_LAMBDA`. With a throttle channel a stretch counts only
 * when the throttle is closed for at least half of it (fuel cut happens on overrun); without
 * one, the plateau must look like a clipped reading (piled up at its top, next to nothing above
 * it). Levels are tried from the leanest reading down in half-band steps, so a few glitches above
 * the ceiling, or (with a throttle channel) a stuck value at open throttle, do not hide it.
 * Without a lambda channel the answer is null.
 */
export function detectLambdaCeiling(log: ColumnarLog): LambdaCeiling | null {
  const lambda = log.channels.lambda;
  if (!lambda) return null;
  const time = requireChannel(log, 'time');
  const tps = log.channels.tps;
  const step = medianTimeStep(time);
  if (!(step > 0)) return null;

  // Only readings that could sit on a ceiling's band matter; usually a few percent of the log.
  const floor = MIN_CEILING_LAMBDA * (1 - CEILING_BAND);
  let count = 0;
  for (let i = 0; i < lambda.length; i++) if (lambda[i] >= floor) count++;
  if (count === 0) return null;
  const candidates = new Int32Array(count);
  const levels = new Float64Array(count);
  let levelCount = 0;
  for (let i = 0, c = 0; i < lambda.length; i++) {
    if (!(lambda[i] >= floor)) continue;
    candidates[c++] = i;
    if (lambda[i] >= MIN_CEILING_LAMBDA) levels[levelCount++] = lambda[i];
  }
  const sortedLevels = levels.subarray(0, levelCount).sort();

  // Closed-throttle counts as prefix sums, so a stretch's closed share is O(1).
  let closedBefore: Int32Array | null = null;
  if (tps) {
    const closed = closedThrottleMask(tps);
    closedBefore = new Int32Array(log.length + 1);
    for (let i = 0; i < log.length; i++) closedBefore[i + 1] = closedBefore[i] + closed[i];
  }

  const plateauAt = (level: number, above: number): LambdaCeiling | null => {
    const fromLambda = level * (1 - CEILING_BAND);
    const clipFrom = level * (1 - CLIP_TOP_REL);
    let plateauS = 0;
    let runs = 0;
    let inBand = 0;
    let atTop = 0;
    let start = -1;
    let end = -1;
    let runInBand = 0;
    let runAtTop = 0;
    const closeRun = (): void => {
      if (start < 0) return;
      const seconds = time[end] - time[start] + step;
      const closedShare =
        closedBefore === null
          ? 1
          : (closedBefore[end + 1] - closedBefore[start]) / (end - start + 1);
      if (seconds >= MIN_RUN_S && closedShare >= MIN_CLOSED_SHARE) {
        plateauS += seconds;
        runs++;
        inBand += runInBand;
        atTop += runAtTop;
      }
    };
    for (let c = 0; c < candidates.length; c++) {
      const i = candidates[c];
      const v = lambda[i];
      if (!(v >= fromLambda && v <= level)) continue;
      if (start >= 0 && time[i] - time[end] <= step + MAX_DIP_S) {
        end = i;
      } else {
        closeRun();
        start = i;
        end = i;
        runInBand = 0;
        runAtTop = 0;
      }
      runInBand++;
      if (v >= clipFrom) runAtTop++;
    }
    closeRun();
    if (plateauS < MIN_PLATEAU_S) return null;
    if (closedBefore === null) {
      if (atTop < MIN_CLIP_SHARE * inBand || above > MAX_ABOVE_SHARE * inBand) return null;
    }
    return { lambda: level, fromLambda, plateauS, runs };
  };

  // `k` walks the levels from the leanest reading down, so `levelCount − 1 − k` readings lie
  // above the level tried.
  let k = levelCount - 1;
  while (k >= 0) {
    const level = sortedLevels[k];
    const found = plateauAt(level, levelCount - 1 - k);
    if (found) return found;
    const next = level * (1 - CEILING_BAND / 2);
    while (k >= 0 && sortedLevels[k] > next) k--;
  }
  return null;
}

/**
 * 1 where lambda climbs at `CLIMB_RATE_PER_S` or faster (`lambdaRate`, λ/s, from the caller's
 * fit) and reads `leanFrom` or leaner within `CLIMB_REACHES_LEAN_S`: the sensor's rise into a
 * fuel cut, whose first readings are still under the ceiling. All 0 without a lambda channel.
 */
export function markClimbToLean(
  log: ColumnarLog,
  lambdaRate: Float64Array,
  leanFrom: number,
): Uint8Array {
  const out = new Uint8Array(log.length);
  const lambda = log.channels.lambda;
  if (!lambda) return out;
  const time = requireChannel(log, 'time');
  // Walking back in time, the time of the next lean reading is known at every sample.
  let nextLeanS = Number.POSITIVE_INFINITY;
  for (let i = log.length - 1; i >= 0; i--) {
    if (lambda[i] >= leanFrom) nextLeanS = time[i];
    out[i] =
      lambdaRate[i] >= CLIMB_RATE_PER_S && nextLeanS - time[i] <= CLIMB_REACHES_LEAN_S ? 1 : 0;
  }
  return out;
}

/**
 * 1 where an overrun is going into fuel cut: throttle closed, engine speed more than
 * `IDLE_MARGIN_RPM` above idle (the 10th percentile of running closed-throttle speed) and lambda
 * climbing to `MIN_CEILING_LAMBDA` (see {@link markClimbToLean}). Null when the log lacks the
 * throttle, engine speed or lambda; all 0 when it never closes the throttle with the engine
 * running.
 */
export function markOverrunEntry(log: ColumnarLog, lambdaRate: Float64Array): Uint8Array | null {
  const tps = log.channels.tps;
  const rpm = log.channels.rpm;
  if (!tps || !rpm || !log.channels.lambda) return null;
  const closed = closedThrottleMask(tps);
  const idleRpm = quantileWhere(rpm, IDLE_QUANTILE, (i) => closed[i] === 1 && rpm[i] > 0);
  if (Number.isNaN(idleRpm)) return new Uint8Array(log.length);
  const overrunRpm = idleRpm + IDLE_MARGIN_RPM;
  const out = markClimbToLean(log, lambdaRate, MIN_CEILING_LAMBDA);
  for (let i = 0; i < log.length; i++) {
    if (closed[i] !== 1 || !(rpm[i] > overrunRpm)) out[i] = 0;
  }
  return out;
}
