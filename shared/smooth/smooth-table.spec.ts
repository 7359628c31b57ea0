import { type Grid } from '../core/table';
import { gaussianFilter, gaussianKernel, normalizedConvolution } from './gaussian-filter';
import { smoothTable } from './smooth-table';

const grid = (rows: number, cols: number, values: number[]): Grid => ({
  rows,
  cols,
  data: Float64Array.from(values),
});

describe('gaussianFilter', () => {
  it('When the grid is constant, then it stays constant (nearest edges lose nothing)', () => {
    const out = gaussianFilter(grid(3, 4, new Array<number>(12).fill(7)), 1.3);
    out.data.forEach((v) => expect(v).toBeCloseTo(7, 13));
  });

  it('When sigma is not positive, then it throws naming it', () => {
    expect(() => gaussianKernel(0)).toThrow('sigma');
    expect(() => gaussianKernel(1, -1)).toThrow('truncate');
  });
});

describe('normalizedConvolution', () => {
  it('When one confident cell stands among zero-confidence cells, then all take its value', () => {
    const values = grid(1, 5, [1, 2, 10, 4, 5]);
    const confidence = grid(1, 5, [0, 0, 1, 0, 0]);
    normalizedConvolution(values, confidence, 1).data.forEach((v) => expect(v).toBeCloseTo(10, 12));
  });

  it('When no confident cell is within reach, then the result is NaN', () => {
    const out = normalizedConvolution(grid(1, 3, [1, 2, 3]), grid(1, 3, [0, 0, 0]), 1);
    expect(Number.isNaN(out.data[1])).toBe(true);
  });

  it('When confidence is negative, then it throws', () => {
    expect(() => normalizedConvolution(grid(1, 2, [1, 2]), grid(1, 2, [1, -1]), 1)).toThrow(
      'confidence cell 1',
    );
  });
});

describe('smoothTable', () => {
  const values = grid(1, 5, [10, 10, 20, 10, 10]);

  it('When confidence is high, then the cell barely moves; when none, it moves by strength', () => {
    const confident = smoothTable(values, grid(1, 5, [1, 1, 1000, 1, 1]), { strength: 1 });
    const unsure = smoothTable(values, grid(1, 5, [1, 1, 0, 1, 1]), { strength: 1 });
    expect(Math.abs((confident.data[2] as number) - 20)).toBeLessThan(0.1);
    expect(unsure.data[2]).toBeCloseTo(10, 12); // its own value carries no confidence
  });

  it('When strength is 0 or a cell is locked, then the value is unchanged', () => {
    const c = grid(1, 5, [1, 1, 1, 1, 1]);
    expect(Array.from(smoothTable(values, c, { strength: 0 }).data)).toEqual(
      Array.from(values.data),
    );
    const locked = smoothTable(values, c, {
      strength: 1,
      locked: Uint8Array.from([0, 0, 1, 0, 0]),
    });
    expect(locked.data[2]).toBe(20);
    expect(locked.data[1]).toBeGreaterThan(10);
  });

  it('When options are out of range, then the error names them', () => {
    const c = grid(1, 5, [1, 1, 1, 1, 1]);
    expect(() => smoothTable(values, c, { strength: 2 })).toThrow('options.strength');
    expect(() => smoothTable(values, c, { sigmaCells: 0 })).toThrow('options.sigmaCells');
    expect(() => smoothTable(values, c, { halfConfidence: 0 })).toThrow('options.halfConfidence');
    expect(() => smoothTable(values, grid(5, 1, [1, 1, 1, 1, 1]))).toThrow('confidence is 5×1');
  });

  it('When called, then the inputs are left untouched', () => {
    const before = Array.from(values.data);
    smoothTable(values, grid(1, 5, [0, 0, 0, 0, 0]), { strength: 1 });
    expect(Array.from(values.data)).toEqual(before);
  });
});
