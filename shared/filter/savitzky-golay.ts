/**
 * Savitzky–Golay weights: the least-squares polynomial of degree `polyOrder` through a window of
 * evenly spaced samples, evaluated (or differentiated) at one position of the window, is a fixed
 * weighted sum of the samples. These are those weights.
 */

/** Options of {@link savitzkyGolayCoefficients}. */
export interface SavitzkyGolayCoefficientOptions {
  /** Derivative order: 0 smooths, 1 gives the rate, 2 the curvature. Default 0. */
  derivative?: number;
  /** Sample spacing, in the unit the derivative is taken against. Default 1. */
  delta?: number;
  /** Window index where the fit is evaluated. Default the centre, (windowLength − 1) / 2. */
  position?: number;
}

/**
 * The Savitzky–Golay weights for a window of `windowLength` evenly spaced samples, in sample
 * order: the estimate at `position` is Σ c[j]·y[j]. This is the same order as scipy's
 * `savgol_coeffs(..., use='dot')` (its default `use='conv'` is the reverse).
 */
export function savitzkyGolayCoefficients(
  windowLength: number,
  polyOrder: number,
  options: SavitzkyGolayCoefficientOptions = {},
): Float64Array {
  const { derivative = 0, delta = 1 } = options;
  const position = options.position ?? (windowLength - 1) / 2;
  if (!Number.isInteger(windowLength) || windowLength < 1) {
    throw new Error('savitzkyGolayCoefficients: windowLength must be a positive integer');
  }
  if (!Number.isInteger(polyOrder) || polyOrder < 0 || polyOrder >= windowLength) {
    throw new Error('savitzkyGolayCoefficients: polyOrder must be an integer in [0, windowLength)');
  }
  if (!Number.isInteger(derivative) || derivative < 0) {
    throw new Error('savitzkyGolayCoefficients: derivative must be a non-negative integer');
  }
  if (!(delta > 0) || !Number.isFinite(delta)) {
    throw new Error('savitzkyGolayCoefficients: delta must be a positive finite number');
  }
  if (!Number.isInteger(position) || position < 0 || position >= windowLength) {
    throw new Error('savitzkyGolayCoefficients: position must be an integer index in the window');
  }
  const offsets = new Float64Array(windowLength);
  for (let j = 0; j < windowLength; j++) offsets[j] = (j - position) * delta;
  return polynomialFitWeights(offsets, polyOrder, derivative);
}

/**
 * Weights w such that Σ w[j]·y[j] is the `derivative`-th derivative, at x = 0, of the
 * least-squares polynomial of degree `polyOrder` through the points (offsets[j], y[j]). Works
 * for uneven offsets, which is how uneven time steps are handled. A derivative above
 * `polyOrder` is 0. Throws when the points cannot determine the polynomial (too few distinct
 * offsets).
 */
export function polynomialFitWeights(
  offsets: ArrayLike<number>,
  polyOrder: number,
  derivative = 0,
): Float64Array {
  const n = offsets.length;
  const m = polyOrder + 1;
  const weights = new Float64Array(n);
  if (derivative > polyOrder) return weights;
  // Scale x to about [−1, 1] so the normal equations stay well conditioned for long windows.
  let scale = 0;
  for (let j = 0; j < n; j++) scale = Math.max(scale, Math.abs(offsets[j] as number));
  if (!(scale > 0)) {
    throw new Error('polynomialFitWeights: offsets must not all be zero');
  }
  // Normal matrix G = VᵀV with V[j][k] = u_j^k, u = x / scale.
  const gram = new Float64Array(m * m);
  const powers = new Float64Array(2 * m - 1);
  for (let j = 0; j < n; j++) {
    const u = (offsets[j] as number) / scale;
    let pk = 1;
    for (let k = 0; k < 2 * m - 1; k++) {
      powers[k] = pk;
      pk *= u;
    }
    for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) gram[a * m + b] += powers[a + b];
  }
  // Solve G z = e_d: the fitted coefficient a_d = zᵀVᵀy, so weight_j = Σ_k z_k u_j^k.
  const rhs = new Float64Array(m);
  rhs[derivative] = 1;
  const z = solveDense(gram, rhs, m);
  let factorial = 1;
  for (let k = 2; k <= derivative; k++) factorial *= k;
  const factor = factorial / Math.pow(scale, derivative);
  for (let j = 0; j < n; j++) {
    const u = (offsets[j] as number) / scale;
    let sum = 0;
    let pk = 1;
    for (let k = 0; k < m; k++) {
      sum += z[k] * pk;
      pk *= u;
    }
    weights[j] = sum * factor;
  }
  return weights;
}

/** Solves the m×m system A x = b (row-major A) by Gaussian elimination with partial pivoting. */
function solveDense(matrix: Float64Array, rhs: Float64Array, m: number): Float64Array {
  const a = Float64Array.from(matrix);
  const b = Float64Array.from(rhs);
  for (let col = 0; col < m; col++) {
    let pivot = col;
    for (let r = col + 1; r < m; r++) {
      if (Math.abs(a[r * m + col]) > Math.abs(a[pivot * m + col])) pivot = r;
    }
    if (!(Math.abs(a[pivot * m + col]) > 1e-12)) {
      throw new Error('polynomialFitWeights: too few distinct points for the polynomial order');
    }
    if (pivot !== col) {
      for (let k = 0; k < m; k++) {
        const t = a[col * m + k];
        a[col * m + k] = a[pivot * m + k];
        a[pivot * m + k] = t;
      }
      const t = b[col];
      b[col] = b[pivot];
      b[pivot] = t;
    }
    for (let r = col + 1; r < m; r++) {
      const f = a[r * m + col] / a[col * m + col];
      if (f === 0) continue;
      for (let k = col; k < m; k++) a[r * m + k] -= f * a[col * m + k];
      b[r] -= f * b[col];
    }
  }
  const x = new Float64Array(m);
  for (let r = m - 1; r >= 0; r--) {
    let sum = b[r];
    for (let k = r + 1; k < m; k++) sum -= a[r * m + k] * x[k];
    x[r] = sum / a[r * m + r];
  }
  return x;
}
