import { dotDivide, multiply, subtract } from 'mathjs';
import { type VeTable } from '../core/table';
import { compareTables } from './compare-tables';

const axes = { rpmAxis: [1000, 2000, 3000], mapAxisKpa: [40, 100] };
const a: VeTable = {
  ...axes,
  values: [
    [50, 60, 70],
    [80, 90, 100],
  ],
};

function withValues(values: number[][]): VeTable {
  return { ...axes, values };
}

describe('compareTables grids', () => {
  it('When b differs from a, then absolute and percent match mathjs element-wise', () => {
    // Source: mathjs 15.2.0 subtract / dotDivide / multiply [C]
    const b = withValues([
      [55, 60, 63],
      [80.5, 90, 110],
    ]);
    const result = compareTables(a, b);
    const expectedAbs = subtract(b.values as number[][], a.values as number[][]) as number[][];
    const expectedPct = multiply(dotDivide(expectedAbs, a.values as number[][]), 100) as number[][];
    result.absolute.forEach((row, r) =>
      row.forEach((v, c) => expect(v).toBeCloseTo(expectedAbs[r]![c]!, 12)),
    );
    result.percent.forEach((row, r) =>
      row.forEach((v, c) => expect(v).toBeCloseTo(expectedPct[r]![c]!, 12)),
    );
  });
});

describe('compareTables summary', () => {
  // computed by hand from the definitions in compare-tables.ts
  it.each([
    {
      name: 'identical tables',
      b: [
        [50, 60, 70],
        [80, 90, 100],
      ],
      summary: { cellsChanged: 0, meanChangePct: 0, maxChangePct: 0, richer: 0, leaner: 0 },
    },
    {
      name: 'one cell +10 %',
      b: [
        [55, 60, 70],
        [80, 90, 100],
      ],
      summary: { cellsChanged: 1, meanChangePct: 10, maxChangePct: 10, richer: 1, leaner: 0 },
    },
    {
      name: 'one up 10 %, one down 10 %, one down 5 %',
      b: [
        [55, 60, 63],
        [76, 90, 100],
      ],
      summary: {
        cellsChanged: 3,
        meanChangePct: 25 / 3,
        maxChangePct: 10,
        richer: 1,
        leaner: 2,
      },
    },
    {
      name: 'changes under the epsilon of 0.005 VE points',
      b: [
        [50.004, 60, 70],
        [80, 89.996, 100],
      ],
      summary: { cellsChanged: 0, meanChangePct: 0, maxChangePct: 0, richer: 0, leaner: 0 },
    },
  ])('When $name, then the summary is as defined', ({ b, summary }) => {
    const result = compareTables(a, withValues(b));
    expect(result.summary.cellsChanged).toBe(summary.cellsChanged);
    expect(result.summary.richer).toBe(summary.richer);
    expect(result.summary.leaner).toBe(summary.leaner);
    expect(result.summary.meanChangePct).toBeCloseTo(summary.meanChangePct, 10);
    expect(result.summary.maxChangePct).toBeCloseTo(summary.maxChangePct, 10);
  });

  it('When the epsilon is 0, then any difference counts', () => {
    const b = withValues([
      [50.001, 60, 70],
      [80, 90, 100],
    ]);
    expect(compareTables(a, b, { epsilon: 0 }).summary.cellsChanged).toBe(1);
  });
});

describe('compareTables checks', () => {
  it('When the axes differ, then it throws', () => {
    const b = { ...a, rpmAxis: [1000, 2000, 3500] };
    expect(() => compareTables(a, b)).toThrow('same rpmAxis and mapAxisKpa');
  });

  it('When a has a zero cell, then it throws naming the cell', () => {
    const zero = withValues([
      [0, 60, 70],
      [80, 90, 100],
    ]);
    expect(() => compareTables(zero, a)).toThrow('a.values[0][0]');
  });

  it('When the shape is wrong, then it throws naming the table', () => {
    expect(() => compareTables(a, withValues([[1, 2, 3]]))).toThrow('compareTables: b');
  });

  it('When compared, then neither input changes', () => {
    const b = withValues([
      [55, 60, 63],
      [76, 90, 100],
    ]);
    const before = JSON.stringify([a, b]);
    compareTables(a, b);
    expect(JSON.stringify([a, b])).toBe(before);
  });
});
