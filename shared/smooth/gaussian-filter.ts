import { validateGrid } from '../core/grid-checks';
import { type Grid } from '../core/table';

function checkSigma(sigma: number, truncate: number): void {
  if (!(sigma > 0) || !Number.isFinite(sigma)) throw new Error('sigma must be a finite number > 0');
  if (!(truncate > 0) || !Number.isFinite(truncate)) {
    throw new Error('truncate must be a finite number > 0');
  }
}

/**
 * The normalized 1-D Gaussian kernel of standard deviation `sigma` (cells), cut at
 * `truncate`·sigma: radius ⌊truncate·sigma + 0.5⌋, weights exp(−x²/2σ²) scaled to sum to 1.
 * Same construction as scipy.ndimage's gaussian_filter1d, so results can be checked against it.
 */
export function gaussianKernel(sigma: number, truncate = 4): Float64Array {
  checkSigma(sigma, truncate);
  const radius = Math.floor(truncate * sigma + 0.5);
  const kernel = new Float64Array(2 * radius + 1);
  let sum = 0;
  for (let x = -radius; x <= radius; x++) {
    const v = Math.exp((-0.5 * x * x) / (sigma * sigma));
    kernel[x + radius] = v;
    sum += v;
  }
  for (let i = 0; i < kernel.length; i++) kernel[i] = (kernel[i] as number) / sum;
  return kernel;
}

/** One separable pass along rows (`alongCols` false: down each column) with edge clamping. */
function convolveAxis(
  src: Float64Array,
  rows: number,
  cols: number,
  kernel: Float64Array,
  alongCols: boolean,
): Float64Array {
  const out = new Float64Array(src.length);
  const radius = (kernel.length - 1) / 2;
  const n = alongCols ? cols : rows;
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const pos = alongCols ? c : r;
      let acc = 0;
      for (let j = -radius; j <= radius; j++) {
        // 'nearest' edges: a cell past the edge repeats the edge cell.
        const q = Math.min(n - 1, Math.max(0, pos + j));
        const idx = alongCols ? r * cols + q : q * cols + c;
        acc += (kernel[j + radius] as number) * (src[idx] as number);
      }
      out[r * cols + c] = acc;
    }
  }
  return out;
}

/**
 * A grid blurred by a 2-D Gaussian of `sigmaCells` (separable: along MAP, then along RPM), edges
 * extended with the nearest cell (scipy mode 'nearest'), kernel cut at `truncate`·sigma.
 * NaN values spread NaN; use `normalizedConvolution` for grids with gaps.
 */
export function gaussianFilter(grid: Grid, sigmaCells: number, truncate = 4): Grid {
  validateGrid(grid, 'grid');
  const kernel = gaussianKernel(sigmaCells, truncate);
  const down = convolveAxis(grid.data, grid.rows, grid.cols, kernel, false);
  return {
    rows: grid.rows,
    cols: grid.cols,
    data: convolveAxis(down, grid.rows, grid.cols, kernel, true),
  };
}

/**
 * Confidence-weighted Gaussian (normalized convolution, Knutsson & Westin 1993):
 * ŝ = G∗(c·v) / G∗(c). Cells with high confidence c pull the local average toward their value;
 * cells with c = 0 or a NaN value contribute nothing. Where no confident cell is within reach
 * (G∗c = 0) the result is NaN.
 */
export function normalizedConvolution(
  values: Grid,
  confidence: Grid,
  sigmaCells: number,
  truncate = 4,
): Grid {
  validateGrid(values, 'values');
  validateGrid(confidence, 'confidence', values);
  const n = values.data.length;
  const weighted = new Float64Array(n);
  const conf = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const c = confidence.data[k] as number;
    const v = values.data[k] as number;
    if (!(c >= 0) || !Number.isFinite(c)) {
      throw new Error(`confidence cell ${k} must be a finite number ≥ 0`);
    }
    if (!Number.isFinite(v)) continue;
    conf[k] = c;
    weighted[k] = c * v;
  }
  const { rows, cols } = values;
  const num = gaussianFilter({ rows, cols, data: weighted }, sigmaCells, truncate).data;
  const den = gaussianFilter({ rows, cols, data: conf }, sigmaCells, truncate).data;
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const d = den[k] as number;
    out[k] = d > 0 ? (num[k] as number) / d : NaN;
  }
  return { rows, cols, data: out };
}
