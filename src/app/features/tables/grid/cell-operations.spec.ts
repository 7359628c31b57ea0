import {
  type CellOperation,
  type OperationInput,
  applyCellOperation,
  heldNote,
  isGuardedOperation,
} from './cell-operations';
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

/**
 * The fuel-safety guard under load: smooth and fill gaps guess values, so a cell at or above the
 * load line keeps its value where the guess would lean it beyond the allowance; deliberate edits
 * are not guarded.
 */
describe('applyCellOperation under the fuel-safety guard', () => {
  // MAP 60 kPa (part load), 100 and 120 kPa (at or above the default line, 91.19 kPa).
  const LOADED_MAP = [60, 100, 120];
  const RPM = [1000, 2000, 3000];
  const MIDDLE = { r0: 1, r1: 1, c0: 1, c1: 1 };

  /** A 3 × 3 table whose middle cell (100 kPa) fills to (50 + 80 + 80 + 70) / 4 = 70. */
  function table(middle: number): number[][] {
    return [
      [1, 50, 1],
      [80, middle, 80],
      [1, 70, 1],
    ];
  }

  function guarded(values: number[][], bounds = MIDDLE, guard?: OperationInput['guard']) {
    return applyCellOperation(
      { ...input(values, bounds, { rpmAxis: RPM, mapAxisKpa: LOADED_MAP }), guard },
      { kind: 'fillGaps' },
    );
  }

  it.each([
    // 90 → 70 is 22 % leaner: held at 90.
    [90, 90, 1],
    // 70.5 → 70 is 0.71 % leaner, within the 1 % allowance: filled.
    [70.5, 70, 0],
    // 60 → 70 is richer: filled.
    [60, 70, 0],
  ])(
    'When a cell under load at %d is filled, then it becomes %d (%d held)',
    (before, after, heldCount) => {
      const result = guarded(table(before));
      if (!result.ok) throw new Error(result.message);
      expect(result.values[1][1]).toBe(after);
      expect(result.held).toHaveLength(heldCount);
      // The default guard: 90 % of 101.325 kPa, 1 %.
      expect(result.guard?.leanAllowance).toBe(0.01);
      expect(result.guard?.loadLineKpa).toBeCloseTo(91.1925, 9);
    },
  );

  it('When the analysis’s guard puts the line above the cell, then the cell is filled', () => {
    const result = guarded(table(90), MIDDLE, { loadLineKpa: 110, leanAllowance: 0.01 });
    expect(result).toMatchObject({ ok: true, held: [], changed: [{ row: 1, col: 1, value: 70 }] });
  });

  it('When the guard allows 25 %, then a 22 % leaner fill passes', () => {
    const result = guarded(table(90), MIDDLE, { loadLineKpa: 90, leanAllowance: 0.25 });
    expect(result).toMatchObject({ ok: true, held: [] });
  });

  it('When every changed cell is held, then the operation changes nothing and says so', () => {
    const result = guarded(table(90));
    expect(result).toMatchObject({ ok: true, changed: [], held: [{ row: 1, col: 1 }] });
  });

  it('When a table is smoothed, then only leaner guesses under load are held', () => {
    // A dip at 60 kPa and a peak at 100 kPa in the middle column: smoothing lowers the peak
    // (under load: held) and raises the dip (richer).
    const values = [
      [60, 60, 40, 60, 60],
      [90, 90, 120, 90, 90],
      [95, 95, 95, 95, 95],
    ];
    const bounds = { r0: 0, r1: 2, c0: 1, c1: 3 };
    const rpmAxis = [1000, 2000, 3000, 4000, 5000];
    const data = input(values, bounds, { rpmAxis, mapAxisKpa: LOADED_MAP });
    const result = applyCellOperation(data, { kind: 'smooth' });
    // The same smoothing with the line above the table: nothing is under load.
    const free = applyCellOperation(
      { ...data, guard: { loadLineKpa: 1000, leanAllowance: 0.01 } },
      { kind: 'smooth' },
    );
    if (!result.ok || !free.ok) throw new Error('refused');
    expect(free.held).toEqual([]);
    expect(result.held).toContainEqual({ row: 1, col: 2 });
    expect(result.values[1][2]).toBe(120);
    // The dip below the line is smoothed as before.
    expect(result.values[0][2]).toBe(free.values[0][2]);
    expect(free.values[0][2]).toBeGreaterThan(40);
    for (let row = 0; row < 3; row++) {
      for (let col = 1; col <= 3; col++) {
        const before = values[row][col];
        const isHeld = result.held.some((cell) => cell.row === row && cell.col === col);
        const wouldLean = free.values[row][col] < before * 0.99;
        // Held exactly where a cell under load would have been leaned beyond 1 %.
        expect({ row, col, isHeld }).toEqual({
          row,
          col,
          isHeld: LOADED_MAP[row] >= 91.1925 && wouldLean,
        });
        expect(result.values[row][col]).toBe(isHeld ? before : free.values[row][col]);
      }
    }
  });

  it.each<CellOperation>([
    { kind: 'scale', percent: -10 },
    { kind: 'offset', points: -20 },
    { kind: 'set', value: 40 },
  ])('When the user asks for %j under load, then it is done as asked', (op) => {
    const deliberate = applyCellOperation(
      input(table(90), MIDDLE, { rpmAxis: RPM, mapAxisKpa: LOADED_MAP }),
      op,
    );
    expect(deliberate).toMatchObject({ ok: true, held: [], guard: null });
    if (deliberate.ok) expect(deliberate.values[1][1]).toBeLessThan(90 * 0.99);
    expect(isGuardedOperation(op)).toBe(false);
  });

  it.each([
    [
      [{ row: 1, col: 1 }],
      'Fuel-safety guard: 1 cell under load kept its value — the operation would have made it more than 1 % leaner. Scale or set it to change it on purpose.',
    ],
    [
      [
        { row: 1, col: 1 },
        { row: 2, col: 1 },
      ],
      'Fuel-safety guard: 2 cells under load kept their value — the operation would have made them more than 1.5 % leaner. Scale or set them to change them on purpose.',
    ],
  ])('When cells %j are held, then the note reads %j', (held, note) => {
    const allowance = held.length === 1 ? 0.01 : 0.015;
    expect(heldNote(held, { loadLineKpa: 91, leanAllowance: allowance })).toBe(note);
  });

  it('When nothing is held or no guard ran, then there is no note', () => {
    expect(heldNote([], { loadLineKpa: 91, leanAllowance: 0.01 })).toBeNull();
    expect(heldNote([{ row: 0, col: 0 }], null)).toBeNull();
  });
});
