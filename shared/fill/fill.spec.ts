import { type Grid } from '../core/table';
import { fillGaps } from './fill-gaps';
import { applyRatios, fillRatios, reachDistance } from './fill-ratios';
import { solveHarmonic } from './solve-harmonic';

const grid = (rows: number, cols: number, values: number[]): Grid => ({
  rows,
  cols,
  data: Float64Array.from(values),
});

describe('solveHarmonic', () => {
  it('When solved, then the true residual is below the tolerance and inputs are untouched', () => {
    const values = new Float64Array(30 * 30);
    const fixed = new Uint8Array(30 * 30);
    fixed[0] = 1;
    values[0] = 100;
    fixed[899] = 1;
    values[899] = -40;
    const before = Array.from(values);
    const out = solveHarmonic(values, fixed, 30, 30);
    expect(out.residual).toBeLessThan(1e-12 * 100);
    expect(out.iterations).toBeGreaterThan(0);
    expect(Array.from(values)).toEqual(before);
  });

  it('When sizes disagree, then it throws naming the argument', () => {
    expect(() => solveHarmonic(new Float64Array(3), new Uint8Array(4), 2, 2)).toThrow('values');
    expect(() => solveHarmonic(new Float64Array(4), new Uint8Array(3), 2, 2)).toThrow('fixed');
  });
});

describe('fillGaps', () => {
  it('When a row has a gap between two values, then it is filled on the straight line', () => {
    const out = Array.from(fillGaps(grid(1, 5, [10, NaN, NaN, NaN, 30])).data);
    expect(out.map((v) => Number(v.toFixed(12)))).toEqual([10, 15, 20, 25, 30]);
  });

  it('When a gap touches only the edge, then it takes the edge-most value (zero flux)', () => {
    expect(Array.from(fillGaps(grid(1, 3, [4, NaN, NaN])).data)).toEqual([4, 4, 4]);
  });

  it('When no cell holds a value, then the grid stays empty; infinite values are refused', () => {
    expect(fillGaps(grid(2, 2, [NaN, NaN, NaN, NaN])).data.every(Number.isNaN)).toBe(true);
    expect(() => fillGaps(grid(1, 2, [1, Infinity]))).toThrow('values cell 1 is infinite');
  });
});

describe('fillRatios', () => {
  const ratio = grid(1, 6, [1.1, 0, 0, 0, 0, 0]);
  const known = Uint8Array.from([1, 0, 0, 0, 0, 0]);

  it('When nothing limits the reach, then a lone known ratio spreads everywhere', () => {
    fillRatios(ratio, known).data.forEach((v) => expect(v).toBeCloseTo(1.1, 12));
  });

  it('When maxReach is 2, then the fill fades to 1 at the cells beyond reach', () => {
    const out = Array.from(fillRatios(ratio, known, { maxReach: 2 }).data);
    expect(out.map((v) => Number(v.toFixed(12)))).toEqual([
      1.1, 1.066666666667, 1.033333333333, 1, 1, 1,
    ]);
  });

  it('When no cell is known, then every ratio is 1', () => {
    expect(Array.from(fillRatios(ratio, new Uint8Array(6)).data)).toEqual([1, 1, 1, 1, 1, 1]);
  });

  it('When arguments are wrong, then the error names them', () => {
    expect(() => fillRatios(ratio, new Uint8Array(5))).toThrow('known has 5 entries');
    expect(() => fillRatios(ratio, known, { maxReach: 1.5 })).toThrow('options.maxReach');
    expect(() => fillRatios(grid(1, 2, [0, 1]), Uint8Array.from([1, 0]))).toThrow('ratio cell 0');
  });

  it('When distances are asked for, then they count 4-neighbour steps', () => {
    expect(Array.from(reachDistance(Uint8Array.from([0, 0, 0, 1]), 2, 2))).toEqual([2, 1, 1, 0]);
  });
});

describe('applyRatios', () => {
  it('When ratios are applied, then each VE is multiplied and the shape of the base is kept', () => {
    const base = {
      rpmAxis: [1000, 2000],
      mapAxisKpa: [50, 100],
      values: [
        [40, 80],
        [60, 90],
      ],
    };
    const out = applyRatios(base, grid(2, 2, [1.1, 1.1, 1, 0.5])).data;
    expect(Array.from(out).map((v) => Number(v.toFixed(12)))).toEqual([44, 88, 60, 45]);
  });

  it('When a ratio is not positive or shapes differ, then it throws', () => {
    const base = grid(1, 2, [40, 80]);
    expect(() => applyRatios(base, grid(1, 2, [1, NaN]))).toThrow('ratios cell 1');
    expect(() => applyRatios(base, grid(2, 1, [1, 1]))).toThrow('ratios is 2×1');
  });
});

describe('filling ratios rather than VE values', () => {
  it('When a shaped table has a smooth error, then the ratio fill lands far closer than a VE fill', () => {
    // A 10×12 base with a VE peak mid-table; the engine's true VE is the base times a gentle
    // error field. Only every third row is measured.
    const rows = 10;
    const cols = 12;
    const base = new Float64Array(rows * cols);
    const truth = new Float64Array(rows * cols);
    const known = new Uint8Array(rows * cols);
    const gaps = new Float64Array(rows * cols);
    const ratio = new Float64Array(rows * cols);
    for (let r = 0; r < rows; r++) {
      for (let c = 0; c < cols; c++) {
        const k = r * cols + c;
        base[k] = 45 + 40 * Math.exp(-((c - 7) ** 2) / 10) + 3 * r;
        truth[k] = (base[k] as number) * (1 + 0.04 * Math.sin(c / 4 + r / 6));
        known[k] = r % 3 === 0 ? 1 : 0;
        gaps[k] = known[k] ? (truth[k] as number) : NaN;
        ratio[k] = (truth[k] as number) / (base[k] as number);
      }
    }
    const byRatio = applyRatios(
      { rows, cols, data: base },
      fillRatios({ rows, cols, data: ratio }, known),
    ).data;
    const byValue = fillGaps({ rows, cols, data: gaps }).data;
    const worst = (v: Float64Array) =>
      Math.max(...v.map((x, k) => Math.abs(x - (truth[k] as number))));
    expect(worst(byRatio) * 5).toBeLessThan(worst(byValue));
  });
});
