import { createGrid, type Grid, type VeTable } from '../core/table';
import { applyAnalysis } from './apply-analysis';

const base: VeTable = {
  rpmAxis: [1000, 2000, 3000, 4000],
  mapAxisKpa: [30, 60, 90],
  values: [
    [40, 45, 50, 48],
    [60, 70, 75, 72],
    [80, 90, 95, 92],
  ],
};

/** Evidence: every cell measured 10 % lean (ratio 1.1) with weight 20, except `empty` cells. */
function evidence(empty: number[] = []) {
  const ratio = createGrid(3, 4, 1.1);
  const weight = createGrid(3, 4, 20);
  const spread = createGrid(3, 4, 0.01);
  for (const i of empty) {
    ratio.data[i] = NaN;
    weight.data[i] = 0;
    spread.data[i] = NaN;
  }
  return { ratio, weight, spread };
}

function at(table: VeTable, r: number, c: number): number {
  return table.values[r]?.[c] as number;
}

describe('applyAnalysis', () => {
  it('When every cell is trusted, then each moves by step × correction', () => {
    const { table } = applyAnalysis(base, evidence(), { stepFraction: 0.5, smooth: 0 });
    expect(at(table, 1, 1)).toBeCloseTo(70 * 1.05, 10);
    expect(at(table, 0, 0)).toBeCloseTo(40 * 1.05, 10);
  });

  it('When a cell is locked, then it keeps its value and its neighbours still move', () => {
    const locked = new Uint8Array(12);
    locked[5] = 1;
    const { table } = applyAnalysis(base, evidence(), { stepFraction: 1, smooth: 0.5, locked });
    expect(at(table, 1, 1)).toBe(70);
    expect(at(table, 1, 2)).toBeCloseTo(75 * 1.1, 6);
  });

  it('When only a selection is applied, then the rest of the table is untouched', () => {
    const only = new Uint8Array(12);
    only[0] = 1;
    const { table } = applyAnalysis(base, evidence(), { stepFraction: 1, smooth: 0, only });
    expect(at(table, 0, 0)).toBeCloseTo(44, 10);
    expect(at(table, 2, 3)).toBe(92);
  });

  it('When cells have no data, then fill carries the neighbours’ ratio, not their values', () => {
    const { table } = applyAnalysis(base, evidence([11]), { stepFraction: 1, smooth: 0 });
    // The empty corner keeps its own shape (92) scaled by the neighbours' ratio (1.1).
    expect(at(table, 2, 3)).toBeCloseTo(92 * 1.1, 6);
  });

  it('When fill is off, then cells without data keep their value', () => {
    const { table } = applyAnalysis(base, evidence([11]), {
      stepFraction: 1,
      smooth: 0,
      fill: false,
    });
    expect(at(table, 2, 3)).toBe(92);
  });

  it('When a mask has the wrong size, then it says which', () => {
    expect(() => applyAnalysis(base, evidence(), { locked: new Uint8Array(3) })).toThrow(
      /options.locked/,
    );
  });

  it('When the evidence grid does not match the table, then it refuses', () => {
    const wrong: Grid = createGrid(2, 2, 1);
    expect(() =>
      applyAnalysis(base, { ratio: wrong, weight: wrong, spread: wrong }, { smooth: 0 }),
    ).toThrow();
  });
});
