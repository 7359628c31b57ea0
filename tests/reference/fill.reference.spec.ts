import fc from 'fast-check';
import { lusolve } from 'mathjs';
import { type Grid } from '../../shared/core/table';
import { fillGaps, fillRatios, reachDistance } from '../../shared/fill';
import {
  maxRelativeDifference,
  readGridFixture,
  toFloat64,
} from '../fixtures/grid/read-grid-fixture';

const ROWS = 7;
const COLS = 8;

/** A 7×8 grid of f(x = col, y = row) with interior holes (none touches the edge). */
function withInteriorHoles(f: (x: number, y: number) => number): { grid: Grid; exact: number[] } {
  const exact: number[] = [];
  const data = new Float64Array(ROWS * COLS);
  for (let y = 0; y < ROWS; y++) {
    for (let x = 0; x < COLS; x++) {
      const v = f(x, y);
      exact.push(v);
      const hole = (y >= 2 && y <= 4 && x >= 2 && x <= 5) || (y === 1 && x === 6);
      data[y * COLS + x] = hole ? NaN : v;
    }
  }
  return { grid: { rows: ROWS, cols: COLS, data }, exact };
}

describe('harmonic fill invariants', () => {
  it.each([
    ['a + bx + cy', (x: number, y: number) => 3 + 2 * x - 1.5 * y],
    ['xy', (x: number, y: number) => x * y],
    ['x² − y²', (x: number, y: number) => x * x - y * y],
  ])('When the known cells hold %s, then interior holes are reproduced exactly', (_name, f) => {
    // Source: computed from the formulas (reference.md §8): discrete harmonic functions [C]
    const { grid, exact } = withInteriorHoles(f);
    expect(maxRelativeDifference(fillGaps(grid).data, exact)).toBeLessThan(1e-11);
  });

  it('When a ratio field is linear, then fillRatios reproduces it in interior holes too', () => {
    // Source: computed from the formulas (reference.md §8) [C]
    const { grid, exact } = withInteriorHoles((x, y) => 1 + 0.01 * x - 0.02 * y);
    const known = Uint8Array.from(grid.data, (v) => (Number.isNaN(v) ? 0 : 1));
    const ratio = { ...grid, data: grid.data.map((v) => (Number.isNaN(v) ? 5 : v)) };
    expect(maxRelativeDifference(fillRatios(ratio, known).data, exact)).toBeLessThan(1e-11);
  });

  it('When a 4×4 grid has a zero border and right column 10, then the interior is 1.25 / 3.75', () => {
    // Source: computed from the formulas (reference.md §8) [C]
    const nan = NaN;
    const data = Float64Array.from([0, 0, 0, 10, 0, nan, nan, 10, 0, nan, nan, 10, 0, 0, 0, 10]);
    const out = fillGaps({ rows: 4, cols: 4, data }).data;
    expect([out[5], out[6], out[9], out[10]].map((v) => Number(v?.toFixed(12)))).toEqual([
      1.25, 3.75, 1.25, 3.75,
    ]);
  });
});

/** The Laplace equations of reference.md §8 as a dense system over the empty cells. */
function denseSystem(grid: Grid): { a: number[][]; b: number[]; free: number[] } {
  const free = [...grid.data.keys()].filter((k) => Number.isNaN(grid.data[k]));
  const a = free.map(() => free.map(() => 0));
  const b = free.map(() => 0);
  free.forEach((k, u) => {
    const r = Math.floor(k / grid.cols);
    const c = k % grid.cols;
    for (const [rr, cc] of [
      [r - 1, c],
      [r + 1, c],
      [r, c - 1],
      [r, c + 1],
    ] as const) {
      if (rr < 0 || rr >= grid.rows || cc < 0 || cc >= grid.cols) continue; // dropped at edges
      const q = rr * grid.cols + cc;
      (a[u] as number[])[u] += 1;
      const j = free.indexOf(q);
      if (j >= 0) (a[u] as number[])[j] -= 1;
      else b[u] += grid.data[q] as number;
    }
  });
  return { a, b, free };
}

describe('harmonic fill against mathjs lusolve', () => {
  it.each([
    [3, 4, [1, 2, 3, 7]],
    [5, 5, [0, 6, 7, 12, 13, 18, 24]],
    [4, 6, [0, 1, 2, 6, 7, 8, 12, 13, 23]],
  ])(
    'When a %i×%i grid has gaps (edges included), then fillGaps equals the dense LU solve',
    (rows, cols, holes) => {
      // Source: mathjs 15.2.0 lusolve on the dense system built here (reference.md §8) [C]
      const data = Float64Array.from({ length: rows * cols }, (_, k) => 50 + ((k * 37) % 23));
      holes.forEach((k) => (data[k] = NaN));
      const grid = { rows, cols, data };
      const { a, b, free } = denseSystem(grid);
      const solution = (lusolve(a, b) as number[][]).map((row) => row[0] as number);
      const filled = fillGaps(grid).data;
      expect(
        maxRelativeDifference(
          free.map((k) => filled[k] as number),
          solution,
        ),
      ).toBeLessThan(1e-10);
    },
  );
});

describe('harmonic fill against scipy', () => {
  const input = readGridFixture('in', 'fill');
  const expected = readGridFixture('out', 'fill');
  const rows = input['rows'] as number;
  const cols = input['cols'] as number;
  const known = Uint8Array.from(input['known'] as number[]);
  const ratios = expected['fillRatios'] as Record<string, number[]>;

  it('When a 12×16 grid is 30 % known, then fillGaps matches scipy spsolve', () => {
    // Source: scipy.sparse.linalg.spsolve of the 5-point equations, generate.py [C]
    const out = fillGaps({ rows, cols, data: toFloat64(input['gaps']) });
    expect(maxRelativeDifference(out.data, toFloat64(expected['fillGaps']))).toBeLessThan(1e-9);
  });

  it('When ratios are filled with and without a reach limit, then they match scipy', () => {
    // Source: scipy.ndimage.distance_transform_cdt (taxicab) and spsolve, generate.py [C]
    const ratio = { rows, cols, data: toFloat64(input['ratio']) };
    const dist = reachDistance(known, rows, cols);
    expect(maxRelativeDifference(dist, toFloat64(expected['reachDistance']))).toBe(0);
    const near = fillRatios(ratio, known, { maxReach: 2 }).data;
    const all = fillRatios(ratio, known).data;
    expect(maxRelativeDifference(near, toFloat64(ratios['reach2']))).toBeLessThan(1e-9);
    expect(maxRelativeDifference(all, toFloat64(ratios['unlimited']))).toBeLessThan(1e-9);
  });
});

describe('maximum principle (property)', () => {
  const cases = fc
    .record({ rows: fc.integer({ min: 1, max: 9 }), cols: fc.integer({ min: 2, max: 9 }) })
    .chain(({ rows, cols }) =>
      fc.record({
        rows: fc.constant(rows),
        cols: fc.constant(cols),
        values: fc.array(fc.double({ min: 0.5, max: 1.5, noNaN: true }), {
          minLength: rows * cols,
          maxLength: rows * cols,
        }),
        known: fc.array(fc.boolean(), { minLength: rows * cols, maxLength: rows * cols }),
        reach: fc.integer({ min: 0, max: 4 }),
      }),
    )
    .filter((c) => c.known.some(Boolean));

  it('When any grid is filled, then filled values stay within [min, max] of the known values', () => {
    // Source: discrete maximum principle of harmonic functions (reference.md §8) [C]
    fc.assert(
      fc.property(cases, ({ rows, cols, values, known }) => {
        const data = Float64Array.from(values, (v, k) => (known[k] ? v : NaN));
        const fixed = values.filter((_, k) => known[k]);
        const lo = Math.min(...fixed) - 1e-12;
        const hi = Math.max(...fixed) + 1e-12;
        return fillGaps({ rows, cols, data }).data.every((v) => v >= lo && v <= hi);
      }),
    );
  });

  it('When ratios are filled with a reach limit, then they stay within the known ratios and 1', () => {
    // Source: discrete maximum principle (reference.md §8) with ratio 1 fixed beyond reach [C]
    fc.assert(
      fc.property(cases, ({ rows, cols, values, known, reach }) => {
        const mask = Uint8Array.from(known, Number);
        const out = fillRatios({ rows, cols, data: Float64Array.from(values) }, mask, {
          maxReach: reach,
        }).data;
        const dist = reachDistance(mask, rows, cols);
        const fixed = [1, ...values.filter((_, k) => known[k])];
        const lo = Math.min(...fixed) - 1e-12;
        const hi = Math.max(...fixed) + 1e-12;
        return out.every(
          (v, k) =>
            v >= lo &&
            v <= hi &&
            (!known[k] || v === values[k]) &&
            ((dist[k] as number) <= reach || v === 1),
        );
      }),
    );
  });
});
