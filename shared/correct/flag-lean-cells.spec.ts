import { type Grid } from '../core/table';
import { flagLeanCells } from './flag-lean-cells';

const grid = (values: number[]): Grid => ({ rows: 2, cols: 2, data: Float64Array.from(values) });

describe('flagLeanCells', () => {
  const cells = {
    rpmAxis: [2000, 4000],
    mapAxisKpa: [60, 120],
    // Row 0 is part load (60 kPa): 20 % lean there is not flagged.
    lambdaError: grid([0.2, 0.2, 0.06, 0.02]),
    worstLean: grid([NaN, NaN, 0.08, 0.12]),
    weight: grid([10, 10, 10, 10]),
  };

  it('When loaded cells run lean, then they are flagged, the most severe first', () => {
    const flags = flagLeanCells(cells);
    expect(flags.map((f) => [f.row, f.col, f.severity])).toEqual([
      [1, 1, 'abort'], // mean 2 % lean but one sample 12 % lean
      [1, 0, 'warn'],
    ]);
    expect(flags[1]?.rpm).toBe(2000);
    expect(flags[1]?.mapKpa).toBe(120);
    expect(flags[1]?.leanPercent).toBeCloseTo(6, 12);
  });

  it('When a lean cell rests on less weight than a proposal trusts, then it is only watched', () => {
    const thin = { ...cells, weight: grid([10, 10, 0.3, 4.99]) };
    const flags = flagLeanCells(thin);
    expect(flags.map((f) => [f.row, f.col, f.severity])).toEqual([
      [1, 0, 'watch'],
      [1, 1, 'watch'],
    ]);
    // The threshold follows the analysis's own least weight.
    expect(flagLeanCells(thin, { minWeight: 0.2 }).map((f) => f.severity)).toEqual([
      'abort',
      'warn',
    ]);
  });

  it('When the load threshold is lowered, then part-load cells are flagged too', () => {
    expect(flagLeanCells(cells, { minLoadKpa: 0 })).toHaveLength(4);
  });

  it('When options are inconsistent, then the error names them', () => {
    expect(() => flagLeanCells(cells, { warnLeanPercent: 12 })).toThrow('options.abortLeanPercent');
    expect(() => flagLeanCells({ ...cells, weight: grid([1]) })).toThrow('cells.weight');
  });
});
