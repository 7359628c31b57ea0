/** Options of `solveHarmonic`. */
export interface HarmonicOptions {
  /** Stop when every residual is below tolerance × the largest fixed |value| (or 1). Default 1e-12. */
  readonly tolerance?: number;
}

/** The result of `solveHarmonic`. */
export interface HarmonicSolution {
  /** Fixed cells as given, free cells solved; NaN in free cells no fixed cell connects to. */
  readonly values: Float64Array;
  /** Conjugate-gradient iterations used. */
  readonly iterations: number;
  /** Largest |residual| of the 5-point equations at the end. */
  readonly residual: number;
}

/**
 * Solves the discrete Laplace equation on a rows × cols grid: every free cell equals the mean of
 * its in-grid 4-neighbours (Σ_nb (u_nb − u) = 0, missing neighbours at the edges dropped, i.e. a
 * zero-flux edge), fixed cells (`fixed[k]` ≠ 0) keep `values[k]`. The system restricted to free
 * cells is symmetric positive definite wherever a region touches a fixed cell, so it is solved
 * matrix-free by Jacobi-preconditioned conjugate gradients; regions touching no fixed cell have no
 * unique solution and come back NaN. Inputs are not modified.
 */
export function solveHarmonic(
  values: Float64Array,
  fixed: Uint8Array,
  rows: number,
  cols: number,
  options: HarmonicOptions = {},
): HarmonicSolution {
  const n = rows * cols;
  if (values.length !== n) throw new Error(`values has ${values.length} cells, expected ${n}`);
  if (fixed.length !== n) throw new Error(`fixed has ${fixed.length} cells, expected ${n}`);
  const tolerance = options.tolerance ?? 1e-12;
  if (!(tolerance > 0)) throw new Error('options.tolerance must be > 0');
  const out = new Float64Array(values);
  // Free cells reachable from a fixed cell get a number (their index in the system); the rest NaN.
  const index = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  let head = 0;
  let tail = 0;
  let scale = 1;
  for (let k = 0; k < n; k++) {
    if (fixed[k] === 0) continue;
    const v = values[k] as number;
    if (!Number.isFinite(v)) throw new Error(`values[${k}] of a fixed cell must be finite`);
    scale = Math.max(scale, Math.abs(v));
    queue[tail++] = k;
  }
  const order: number[] = [];
  const visit = (q: number) => {
    if (fixed[q] !== 0 || index[q] !== -1) return;
    index[q] = order.length;
    order.push(q);
    queue[tail++] = q;
  };
  while (head < tail) {
    const k = queue[head++] as number;
    const r = Math.floor(k / cols);
    const c = k - r * cols;
    if (r > 0) visit(k - cols);
    if (r < rows - 1) visit(k + cols);
    if (c > 0) visit(k - 1);
    if (c < cols - 1) visit(k + 1);
  }
  for (let k = 0; k < n; k++) if (fixed[k] === 0 && index[k] === -1) out[k] = NaN;
  const m = order.length;
  if (m === 0) return { values: out, iterations: 0, residual: 0 };

  // A·x for free cells: degree·x_u − Σ free neighbours x_nb; b = Σ fixed neighbours' values.
  const degree = new Float64Array(m);
  const b = new Float64Array(m);
  const neighbours = (k: number, each: (q: number) => void) => {
    const r = Math.floor(k / cols);
    const c = k - r * cols;
    if (r > 0) each(k - cols);
    if (r < rows - 1) each(k + cols);
    if (c > 0) each(k - 1);
    if (c < cols - 1) each(k + 1);
  };
  // Free neighbours of each free cell as a compressed list, so the CG loop is plain array work.
  const start = new Int32Array(m + 1);
  const free: number[] = [];
  order.forEach((k, u) => {
    neighbours(k, (q) => {
      degree[u] += 1;
      if (fixed[q] !== 0) b[u] += values[q] as number;
      else free.push(index[q] as number);
    });
    start[u + 1] = free.length;
  });
  const adjacent = Int32Array.from(free);
  const multiply = (x: Float64Array, y: Float64Array) => {
    for (let u = 0; u < m; u++) {
      let acc = (degree[u] as number) * (x[u] as number);
      for (let e = start[u] as number; e < (start[u + 1] as number); e++) {
        acc -= x[adjacent[e] as number] as number;
      }
      y[u] = acc;
    }
  };
  const x = new Float64Array(m);
  const res = new Float64Array(b);
  const z = new Float64Array(m);
  const p = new Float64Array(m);
  const ap = new Float64Array(m);
  for (let u = 0; u < m; u++) z[u] = (res[u] as number) / (degree[u] as number);
  p.set(z);
  let rz = dot(res, z);
  const limit = tolerance * scale;
  let iterations = 0;
  // CG converges in at most m steps in exact arithmetic; the margin covers rounding.
  while (maxAbs(res) > limit && iterations < 10 * m + 100) {
    multiply(p, ap);
    const alpha = rz / dot(p, ap);
    for (let u = 0; u < m; u++) {
      x[u] = (x[u] as number) + alpha * (p[u] as number);
      res[u] = (res[u] as number) - alpha * (ap[u] as number);
      z[u] = (res[u] as number) / (degree[u] as number);
    }
    const next = dot(res, z);
    const beta = next / rz;
    rz = next;
    for (let u = 0; u < m; u++) p[u] = (z[u] as number) + beta * (p[u] as number);
    iterations++;
  }
  // The recurrence residual drifts from the true one; report the true one.
  multiply(x, ap);
  let residual = 0;
  for (let u = 0; u < m; u++) {
    residual = Math.max(residual, Math.abs((b[u] as number) - (ap[u] as number)));
    out[order[u] as number] = x[u] as number;
  }
  return { values: out, iterations, residual };
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] as number) * (b[i] as number);
  return s;
}

function maxAbs(a: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s = Math.max(s, Math.abs(a[i] as number));
  return s;
}
