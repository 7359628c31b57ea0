import { type Grid } from '../core/table';
import { proposeTable } from './propose-table';

const grid = (values: number[]): Grid => ({ rows: 2, cols: 2, data: Float64Array.from(values) });

const cells = {
  ratio: grid([1.1, 0.9, 1.2, NaN]),
  weight: grid([10, 10, 2, 0]),
  spread: grid([0.01, 0.05, 0.01, NaN]),
};
const base = {
  rpmAxis: [1000, 2000],
  mapAxisKpa: [50, 100],
  values: [
    [50, 60],
    [70, 80],
  ],
};

describe('proposeTable', () => {
  it('When cells differ in data, then each gets its status and only trusted ones change', () => {
    const out = proposeTable(base, cells, { stepFraction: 1 });
    expect(out.status).toEqual(['trusted', 'trusted', 'too_little_data', 'no_data']);
    expect(Array.from(out.values.data)).toEqual([55.00000000000001, 54, 70, 80]);
    expect(Array.from(out.known)).toEqual([1, 1, 0, 0]);
    expect(out.counts).toEqual({ trusted: 2, too_little_data: 1, locked: 0, no_data: 1 });
  });

  it('When a cell is locked, then it keeps its VE and counts as known', () => {
    const out = proposeTable(base, cells, { locked: Uint8Array.from([1, 0, 0, 0]) });
    expect(out.status[0]).toBe('locked');
    expect(out.values.data[0]).toBe(50);
    expect(out.ratio.data[0]).toBe(1);
    expect(out.known[0]).toBe(1);
  });

  it('When maxSpread is set, then a scattered cell is not trusted', () => {
    const out = proposeTable(base, cells, { maxSpread: 0.03 });
    expect(out.status[1]).toBe('too_little_data');
    expect(out.values.data[1]).toBe(60);
  });

  it('When options or shapes are wrong, then the error names them', () => {
    expect(() => proposeTable(base, cells, { stepFraction: 0 })).toThrow('options.stepFraction');
    expect(() => proposeTable(base, cells, { maxStepPercent: -1 })).toThrow(
      'options.maxStepPercent',
    );
    expect(() => proposeTable(base, cells, { minWeight: NaN })).toThrow('options.minWeight');
    expect(() => proposeTable(base, cells, { locked: new Uint8Array(3) })).toThrow(
      'options.locked',
    );
    const wide = { ...cells, ratio: { rows: 1, cols: 4, data: new Float64Array(4) } };
    expect(() => proposeTable(base, wide)).toThrow('cells.ratio is 1×4');
    expect(() => proposeTable(grid([1, 0, 1, 1]), cells)).toThrow('base cell 1');
  });

  it('When called, then the base grid is not modified', () => {
    const g = grid([50, 60, 70, 80]);
    proposeTable(g, cells);
    expect(Array.from(g.data)).toEqual([50, 60, 70, 80]);
  });
});
