import { type CellOperation, type OperationInput, applyCellOperation } from './cell-operations';
import { type CellBounds, cellKey } from './cell-range';

const EVEN_RPM = [1000, 2000, 3000, 4000, 5000];
const MAP = [30, 60, 90];

function input(
  values: number[][],
  bounds: CellBounds,
  options: { locked?: string[]; rpmAxis?: number[]; mapAxisKpa?: number[] } = {},
): OperationInput {
  return {
    values,
    bounds,
    locked: new Set(options.locked ?? []),
    rpmAxis: options.rpmAxis ?? EVEN_RPM.slice(0, values[0].length),
    mapAxisKpa: options.mapAxisKpa ?? MAP.slice(0, values.length),
  };
}

/** The values after `op`, failing the test on a refusal. */
function run(data: OperationInput, op: CellOperation): number[][] {
  const result = applyCellOperation(data, op);
  if (!result.ok) throw new Error(`refused: ${result.message}`);
  return result.values;
}

function refusal(data: OperationInput, op: CellOperation): string {
  const result = applyCellOperation(data, op);
  if (result.ok) throw new Error('expected a refusal');
  return result.message;
}

const ROW = { r0: 0, r1: 0, c0: 0, c1: 4 };

// Expected values below are worked by hand from the formulas in applyCellOperation's JSDoc;
// the smoothing figure is also checked against scipy.ndimage.gaussian_filter [C].
describe('applyCellOperation', () => {
  it.each([
    [{ kind: 'scale', percent: 5 }, [42, 43.29, 105]], // 40·1.05, 41.23·1.05 = 43.2915, 100·1.05
    [{ kind: 'scale', percent: -10 }, [36, 37.11, 90]], // 41.23·0.9 = 37.107
    [{ kind: 'offset', points: -2.5 }, [37.5, 38.73, 97.5]],
    [{ kind: 'set', value: 80 }, [80, 80, 80]],
  ] as const)('When %j runs, then the cells become %j (rounded to 0.01)', (op, expected) => {
    const data = input([[40, 41.23, 100]], { r0: 0, r1: 0, c0: 0, c1: 2 });
    expect(run(data, op)[0]).toEqual(expected);
  });

  it('When blending along a row on even breakpoints, then the inside cells lie on a line', () => {
    // 40 → 60 over four equal steps: 45, 50, 55.
    expect(run(input([[40, 0, 0, 0, 60]], ROW), { kind: 'blend', direction: 'rows' })[0]).toEqual([
      40, 45, 50, 55, 60,
    ]);
  });

  it('When the breakpoints are uneven, then the line is straight in RPM, not in cell steps', () => {
    // rpm 1000, 1500, 3000, 5000: t = 500/4000 = 0.125 → 40 + 0.125·40 = 45; t = 0.5 → 60.
    const data = input(
      [[40, 0, 0, 80]],
      { r0: 0, r1: 0, c0: 0, c1: 3 },
      {
        rpmAxis: [1000, 1500, 3000, 5000],
      },
    );
    expect(run(data, { kind: 'blend', direction: 'rows' })[0]).toEqual([40, 45, 60, 80]);
  });

  it('When blending along columns, then each column runs from its top to its bottom value', () => {
    // kPa 30, 60, 90 (even): the middle is the mean of top and bottom.
    const values = [
      [40, 50],
      [0, 0],
      [60, 91],
    ];
    const out = run(input(values, { r0: 0, r1: 2, c0: 0, c1: 1 }), {
      kind: 'blend',
      direction: 'cols',
    });
    expect(out).toEqual([
      [40, 50],
      [50, 70.5],
      [60, 91],
    ]);
  });

  it('When blending across both, then the cells are bilinear from the four corners', () => {
    // Worked by hand: rpm 1000, 2000, 4000 and kPa 30, 60, 90; corners 40 (top-left),
    // 70 (top-right), 60 (bottom-left), 100 (bottom-right).
    //   t (column 1) = (2000 − 1000)/(4000 − 1000) = 1/3;  u (row 1) = (60 − 30)/(90 − 30) = 1/2
    //   top    = 40 + (70 − 40)/3  = 50
    //   bottom = 60 + (100 − 60)/3 = 73.333…
    //   centre = 50 + (73.333… − 50)/2 = 61.666… → 61.67
    //   left edge middle = 40 + (60 − 40)/2 = 50; right edge middle = 70 + (100 − 70)/2 = 85
    // Bilinear interpolation as in Press et al., Numerical Recipes, 3rd ed., §3.6 [S*, recalled].
    const values = [
      [40, 0, 70],
      [0, 0, 0],
      [60, 0, 100],
    ];
    const out = run(
      input(values, { r0: 0, r1: 2, c0: 0, c1: 2 }, { rpmAxis: [1000, 2000, 4000] }),
      { kind: 'blend', direction: 'both' },
    );
    expect(out).toEqual([
      [40, 50, 70],
      [50, 61.67, 85],
      [60, 73.33, 100],
    ]);
  });

  it.each([
    ['rows', { r0: 0, r1: 2, c0: 0, c1: 1 }, 'needs at least 3 columns'],
    ['cols', { r0: 0, r1: 1, c0: 0, c1: 2 }, 'needs at least 3 rows'],
    ['both', { r0: 0, r1: 2, c0: 0, c1: 1 }, 'needs at least 3 rows and 3 columns'],
  ] as const)('When blending %s over %j, then it is refused: %s', (direction, bounds, text) => {
    const values = [
      [1, 2, 3],
      [4, 5, 6],
      [7, 8, 9],
    ];
    expect(refusal(input(values, bounds), { kind: 'blend', direction })).toContain(text);
  });

  it('When a spike is smoothed, then it moves half-way to its Gaussian neighbourhood', () => {
    // 1 × 9 row of 10 with 20 in the middle; σ = 1 cell, nearest edges, cut at 4σ:
    // centre average 13.9894 (scipy gaussian_filter agrees [C]), so 20 + 0.5·(13.9894 − 20) =
    // 16.9947 → 16.99; its neighbours move to 10 + 0.5·(12.4197 − 10) = 11.21.
    const row = [10, 10, 10, 10, 20, 10, 10, 10, 10];
    const rpmAxis = row.map((_, i) => 1000 + 500 * i);
    const data = input([row], { r0: 0, r1: 0, c0: 3, c1: 5 }, { rpmAxis });
    expect(run(data, { kind: 'smooth' })[0]).toEqual([10, 10, 10, 11.21, 16.99, 11.21, 10, 10, 10]);
  });

  it('When gaps are filled along a row, then the fill is the straight line between its ends', () => {
    // A harmonic fill in one dimension is linear: 10 … 50 → 20, 30, 40.
    expect(
      run(input([[10, 99, 1, 7, 50]], { r0: 0, r1: 0, c0: 1, c1: 3 }), { kind: 'fillGaps' })[0],
    ).toEqual([10, 20, 30, 40, 50]);
  });

  it('When one cell inside the table is filled, then it becomes the mean of its four neighbours', () => {
    const values = [
      [1, 20, 1],
      [30, 99, 50],
      [1, 60, 1],
    ];
    // (20 + 30 + 50 + 60) / 4 = 40
    expect(run(input(values, { r0: 1, r1: 1, c0: 1, c1: 1 }), { kind: 'fillGaps' })[1][1]).toBe(40);
    expect(refusal(input(values, { r0: 0, r1: 2, c0: 0, c1: 2 }), { kind: 'fillGaps' })).toContain(
      'every cell is selected',
    );
  });

  it('When cells are locked, then they keep their value and still count as context', () => {
    const data = input([[40, 0, 0, 0, 60]], ROW, { locked: [cellKey(0, 2)] });
    const result = applyCellOperation(data, { kind: 'blend', direction: 'rows' });
    expect(result).toMatchObject({
      ok: true,
      values: [[40, 45, 0, 55, 60]],
      changed: [
        { row: 0, col: 1, value: 45 },
        { row: 0, col: 3, value: 55 },
      ],
      label: 'Blend along rows',
    });
    const allLocked = input([[40]], { r0: 0, r1: 0, c0: 0, c1: 0 }, { locked: [cellKey(0, 0)] });
    expect(refusal(allLocked, { kind: 'set', value: 50 })).toBe(
      'Every selected cell is locked. Nothing changed.',
    );
  });

  it('When a result would leave 1–300 %, then nothing changes and the cell is named', () => {
    const data = input([[100, 150]], { r0: 0, r1: 0, c0: 0, c1: 1 });
    expect(refusal(data, { kind: 'scale', percent: 150 })).toBe(
      'Scale +150 % would take the cell at 2000 rpm, 30 kPa to 375 %, outside 1–300 %. Nothing changed.',
    );
    expect(refusal(data, { kind: 'offset', points: -120 })).toContain('30 kPa to -20 %');
  });

  it.each([
    [{ kind: 'scale', percent: NaN }, 'Type a scale in percent'],
    [{ kind: 'scale', percent: -100 }, 'Type a scale in percent'],
    [{ kind: 'offset', points: Infinity }, 'Type how many VE points'],
    [{ kind: 'set', value: 0 }, 'between 1 and 300'],
  ] as const)('When the amount of %j is unusable, then it says %j', (op, text) => {
    expect(refusal(input([[50]], { r0: 0, r1: 0, c0: 0, c1: 0 }), op)).toContain(text);
  });

  it('When an operation runs, then its inputs are not mutated', () => {
    const values = Object.freeze([Object.freeze([40, 0, 0, 0, 60])]) as unknown as number[][];
    const data = input(values, ROW);
    for (const op of [
      { kind: 'scale', percent: 5 },
      { kind: 'blend', direction: 'rows' },
      { kind: 'smooth' },
      { kind: 'fillGaps' },
    ] as const) {
      applyCellOperation({ ...data, bounds: { r0: 0, r1: 0, c0: 1, c1: 3 } }, op);
    }
    expect(values).toEqual([[40, 0, 0, 0, 60]]);
  });

  it('When nothing changes, then the result lists no changed cell', () => {
    const result = applyCellOperation(input([[40, 45, 50]], { r0: 0, r1: 0, c0: 0, c1: 2 }), {
      kind: 'blend',
      direction: 'rows',
    });
    expect(result).toMatchObject({ ok: true, changed: [] });
  });
});
