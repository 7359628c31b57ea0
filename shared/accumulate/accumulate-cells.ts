import { locate } from '../core/lookup';
import { type Grid, validateAxis } from '../core/table';
import { validateGrid, validateMask } from '../core/grid-checks';

/** The samples of one or more logs to spread over a table's cells, plus the table's axes. */
export interface AccumulateInput {
  /** RPM breakpoints (columns) of the table being corrected, ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa absolute (rows), ascending. */
  readonly mapAxisKpa: readonly number[];
  /** Engine speed per sample. */
  readonly rpm: Float64Array;
  /** MAP per sample, kPa absolute. */
  readonly mapKpa: Float64Array;
  /** Measured lambda per sample, already shifted for transport delay. */
  readonly lambda: Float64Array;
  /** Commanded lambda per sample. */
  readonly lambdaTarget: Float64Array;
  /** Short-term fuel trim, % (positive: the ECU adds fuel). Absent or NaN counts as 0. */
  readonly stft?: Float64Array;
  /** Long-term fuel trim, %. Absent or NaN counts as 0. */
  readonly ltft?: Float64Array;
  /** Which samples the filters kept (non-zero = keep). Absent: all. */
  readonly keep?: Uint8Array;
  /** A per-sample weight multiplier ≥ 0 (e.g. the sample's duration in s). Absent: 1 each. */
  readonly sampleWeight?: Float64Array;
  /**
   * VE (%) the ECU ran at each sample, read from the revision the log was recorded on (see
   * `veAtSamples`). Given together with `veEditing`, each sample's correction is re-expressed
   * against the table being edited: r' = r · veUsed / veEditing(sample), i.e. the VE the sample
   * implies (veUsed · r) divided by what the edited table holds there. Logs from several
   * revisions then combine into one ratio field relative to the edited table.
   */
  readonly veUsed?: Float64Array;
  /** The VE grid being edited (rows = MAP, cols = RPM), required with `veUsed`. */
  readonly veEditing?: Grid;
}

/** Options of `accumulateCells`. */
export interface AccumulateOptions {
  /**
   * MAP (kPa absolute) at or above which a sample counts as "under load" for `worstLean`.
   * Default 90: wide-open throttle of an NA engine near sea level and all boost, while leaving
   * out part-throttle cruise where a lean excursion harms nothing (common practice, no published
   * source). Lower it for high-altitude logs; 0 watches every sample.
   */
  readonly leanLoadKpa?: number;
}

/** Per-cell results of `accumulateCells`; every grid is rows (MAP) × cols (RPM). */
export interface CellStats {
  /** RPM breakpoints (copied from the input). */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints (copied from the input). */
  readonly mapAxisKpa: readonly number[];
  /** Samples with a weight > 0 on the cell. */
  readonly count: Grid;
  /** W = Σw, the cell's total bilinear weight (times `sampleWeight`). */
  readonly weight: Grid;
  /** Weighted mean correction ratio S/W, r = λ_meas/λ_cmd·(1+STFT)(1+LTFT); NaN where W = 0. */
  readonly ratio: Grid;
  /** Weighted standard deviation of r (population form, √(Σw(r−r̄)²/W)); NaN where W = 0. */
  readonly spread: Grid;
  /** Kish effective sample count (Σw)²/Σw²; 0 where W = 0. */
  readonly effectiveCount: Grid;
  /** Weighted mean lambda error λ_meas/λ_cmd − 1 (positive = lean, trims excluded); NaN if W = 0. */
  readonly lambdaError: Grid;
  /** Max of λ_meas/λ_cmd − 1 over samples under load touching the cell; NaN if none. */
  readonly worstLean: Grid;
  /** Weighted mean measured lambda; NaN where W = 0. */
  readonly lambdaMeasured: Grid;
  /** Weighted mean commanded lambda; NaN where W = 0. */
  readonly lambdaCommanded: Grid;
  /** Kept samples that were spread over the table. */
  readonly samplesUsed: number;
  /** Kept samples left out because a value was missing or out of range (NaN, lambda ≤ 0…). */
  readonly samplesSkipped: number;
}

function checkSamples(input: AccumulateInput): number {
  if (!(input.rpm instanceof Float64Array)) throw new Error('input.rpm must be a Float64Array');
  const n = input.rpm.length;
  const arrays = ['mapKpa', 'lambda', 'lambdaTarget', 'stft', 'ltft', 'sampleWeight', 'veUsed'];
  for (const key of arrays) {
    const a = input[key as keyof AccumulateInput];
    if (a === undefined && ['stft', 'ltft', 'sampleWeight', 'veUsed'].includes(key)) continue;
    if (!(a instanceof Float64Array)) throw new Error(`input.${key} must be a Float64Array`);
    if (a.length !== n) throw new Error(`input.${key} has ${a.length} samples, input.rpm ${n}`);
  }
  if (input.keep !== undefined) validateMask(input.keep, n, 'input.keep');
  return n;
}

/**
 * Spreads every kept sample over the four cells around it with bilinear weights (positions
 * clamped at the table's edges, as the ECU interpolates) and returns per-cell counts, weights,
 * weighted mean and spread of the correction ratio, effective sample count, lambda error,
 * worst lean excursion under load and mean lambdas. One pass, no per-sample allocation.
 */
export function accumulateCells(
  input: AccumulateInput,
  options: AccumulateOptions = {},
): CellStats {
  validateAxis(input.rpmAxis, 'input.rpmAxis');
  validateAxis(input.mapAxisKpa, 'input.mapAxisKpa');
  const n = checkSamples(input);
  const leanLoadKpa = options.leanLoadKpa ?? 90;
  if (!Number.isFinite(leanLoadKpa)) throw new Error('options.leanLoadKpa must be a finite number');
  const rows = input.mapAxisKpa.length;
  const cols = input.rpmAxis.length;
  const { veUsed, veEditing } = input;
  if ((veUsed === undefined) !== (veEditing === undefined)) {
    throw new Error('input.veUsed and input.veEditing must be given together');
  }
  if (veEditing) {
    validateGrid(veEditing, 'input.veEditing', { rows, cols });
    if (!veEditing.data.every((v) => v > 0 && Number.isFinite(v))) {
      throw new Error('input.veEditing must hold finite values > 0');
    }
  }
  const cells = rows * cols;
  const count = new Float64Array(cells);
  const weight = new Float64Array(cells);
  const weightSq = new Float64Array(cells);
  // Ratios sit near 1, so sums of (r − 1) and (r − 1)² keep the variance free of cancellation.
  const shifted = new Float64Array(cells);
  const shiftedSq = new Float64Array(cells);
  const error = new Float64Array(cells);
  const measured = new Float64Array(cells);
  const commanded = new Float64Array(cells);
  const worst = new Float64Array(cells).fill(-Infinity);
  const { rpm, mapKpa, lambda, lambdaTarget, stft, ltft, keep, sampleWeight } = input;
  const editing = veEditing?.data;
  let used = 0;
  let skipped = 0;

  const deposit = (
    k: number,
    w: number,
    d: number,
    err: number,
    lm: number,
    lc: number,
    load: boolean,
  ) => {
    if (!(w > 0)) return;
    count[k] += 1;
    weight[k] += w;
    weightSq[k] += w * w;
    shifted[k] += w * d;
    shiftedSq[k] += w * d * d;
    error[k] += w * err;
    measured[k] += w * lm;
    commanded[k] += w * lc;
    if (load && err > (worst[k] as number)) worst[k] = err;
  };

  for (let s = 0; s < n; s++) {
    if (keep !== undefined && keep[s] === 0) continue;
    const x = rpm[s] as number;
    const y = mapKpa[s] as number;
    const lm = lambda[s] as number;
    const lc = lambdaTarget[s] as number;
    const sw = sampleWeight === undefined ? 1 : (sampleWeight[s] as number);
    // NaN fails every comparison, so one test rejects missing, negative and infinite values.
    if (!(lm > 0 && lc > 0 && sw >= 0 && Number.isFinite(x + y + lm + lc + sw))) {
      skipped++;
      continue;
    }
    const st = stft === undefined ? 0 : (stft[s] as number);
    const lt = ltft === undefined ? 0 : (ltft[s] as number);
    // A logger leaves trims blank in open loop, where the ECU applies none: count them as 0.
    let r = (lm / lc) * (1 + (Number.isFinite(st) ? st : 0) / 100);
    r *= 1 + (Number.isFinite(lt) ? lt : 0) / 100;
    const px = locate(input.rpmAxis, x);
    const py = locate(input.mapAxisKpa, y);
    const k = py.i * cols + px.i;
    const fx = px.f;
    const fy = py.f;
    const w00 = (1 - fx) * (1 - fy);
    const w10 = fx * (1 - fy);
    const w01 = (1 - fx) * fy;
    const w11 = fx * fy;
    if (editing !== undefined && veUsed !== undefined) {
      const ranVe = veUsed[s] as number;
      if (!(ranVe > 0) || !Number.isFinite(ranVe)) {
        skipped++;
        continue;
      }
      const here =
        w00 * (editing[k] as number) +
        w10 * (editing[k + 1] as number) +
        w01 * (editing[k + cols] as number) +
        w11 * (editing[k + cols + 1] as number);
      r *= ranVe / here;
    }
    if (!Number.isFinite(r) || !(r > 0)) {
      skipped++;
      continue;
    }
    used++;
    const d = r - 1;
    const err = lm / lc - 1;
    const load = y >= leanLoadKpa;
    deposit(k, w00 * sw, d, err, lm, lc, load);
    deposit(k + 1, w10 * sw, d, err, lm, lc, load);
    deposit(k + cols, w01 * sw, d, err, lm, lc, load);
    deposit(k + cols + 1, w11 * sw, d, err, lm, lc, load);
  }

  return finishCells(input, rows, cols, used, skipped, {
    count,
    weight,
    weightSq,
    shifted,
    shiftedSq,
    error,
    measured,
    commanded,
    worst,
  });
}

interface Sums {
  count: Float64Array;
  weight: Float64Array;
  weightSq: Float64Array;
  shifted: Float64Array;
  shiftedSq: Float64Array;
  error: Float64Array;
  measured: Float64Array;
  commanded: Float64Array;
  worst: Float64Array;
}

function finishCells(
  input: AccumulateInput,
  rows: number,
  cols: number,
  samplesUsed: number,
  samplesSkipped: number,
  sums: Sums,
): CellStats {
  const cells = rows * cols;
  const ratio = new Float64Array(cells);
  const spread = new Float64Array(cells);
  const effective = new Float64Array(cells);
  for (let k = 0; k < cells; k++) {
    const w = sums.weight[k] as number;
    if (!(w > 0)) {
      ratio[k] = NaN;
      spread[k] = NaN;
      sums.error[k] = NaN;
      sums.measured[k] = NaN;
      sums.commanded[k] = NaN;
      continue;
    }
    const meanShift = (sums.shifted[k] as number) / w;
    ratio[k] = 1 + meanShift;
    spread[k] = Math.sqrt(Math.max(0, (sums.shiftedSq[k] as number) / w - meanShift * meanShift));
    effective[k] = (w * w) / (sums.weightSq[k] as number);
    sums.error[k] = (sums.error[k] as number) / w;
    sums.measured[k] = (sums.measured[k] as number) / w;
    sums.commanded[k] = (sums.commanded[k] as number) / w;
  }
  for (let k = 0; k < cells; k++) if (sums.worst[k] === -Infinity) sums.worst[k] = NaN;
  const grid = (data: Float64Array): Grid => ({ rows, cols, data });
  return {
    rpmAxis: [...input.rpmAxis],
    mapAxisKpa: [...input.mapAxisKpa],
    count: grid(sums.count),
    weight: grid(sums.weight),
    ratio: grid(ratio),
    spread: grid(spread),
    effectiveCount: grid(effective),
    lambdaError: grid(sums.error),
    worstLean: grid(sums.worst),
    lambdaMeasured: grid(sums.measured),
    lambdaCommanded: grid(sums.commanded),
    samplesUsed,
    samplesSkipped,
  };
}
