import { createGrid, type Grid } from '../core/table';
import { estimateBaro } from '../pipeline/estimate-baro';
import type { ColumnarLog } from '../core/channels';
import {
  defaultLoadGuard,
  guardUnderLoad,
  guardValuesUnderLoad,
  STANDARD_BARO_KPA,
} from './load-guard';

const grid = (rows: number, cols: number, values: number[]): Grid => ({
  rows,
  cols,
  data: Float64Array.from(values),
});

describe('guardUnderLoad', () => {
  // Rows: 60 kPa (part load), 100 and 150 kPa (under load at a 91.2 kPa line).
  const mapAxisKpa = [60, 100, 150];
  const guard = defaultLoadGuard();

  it('When the default line is asked for, then it is 90 % of the standard atmosphere', () => {
    // U.S. Standard Atmosphere 1976 sea-level pressure 101.325 kPa (reference.md §4 [S]).
    expect(STANDARD_BARO_KPA).toBe(101.325);
    expect(guard.loadLineKpa).toBeCloseTo(91.1925, 10);
    expect(guard.leanAllowance).toBe(0.01);
  });

  it('When a guess leans a cell under load beyond the allowance, then that cell is held at 1', () => {
    const ratio = grid(3, 2, [0.9, 0.9, 0.985, 0.995, 0.95, 1.05]);
    const settled = new Uint8Array(6);
    const out = guardUnderLoad(ratio, mapAxisKpa, settled, guard);
    // Part load is left alone; 0.995 is within 1 %; richer guesses pass.
    expect(Array.from(out.ratio.data)).toEqual([0.9, 0.9, 1, 0.995, 1, 1.05]);
    expect(Array.from(out.held)).toEqual([0, 0, 1, 0, 1, 0]);
    expect(out.heldCount).toBe(2);
  });

  it('When a cell under load was measured or locked, then its lean correction stands', () => {
    const ratio = grid(3, 2, [1, 1, 0.9, 0.9, 0.9, 0.9]);
    const settled = Uint8Array.from([0, 0, 1, 0, 0, 1]);
    const out = guardUnderLoad(ratio, mapAxisKpa, settled, guard);
    expect(Array.from(out.ratio.data)).toEqual([1, 1, 0.9, 1, 1, 0.9]);
  });

  it('When the figures are wrong, then the error names them', () => {
    const ratio = createGrid(3, 2, 1);
    expect(() => guardUnderLoad(ratio, [60, 100], new Uint8Array(6), guard)).toThrow(
      'mapAxisKpa has 2',
    );
    expect(() =>
      guardUnderLoad(ratio, mapAxisKpa, new Uint8Array(6), { ...guard, leanAllowance: 1 }),
    ).toThrow('guard.leanAllowance');
    expect(() => defaultLoadGuard(0)).toThrow('baroKpa');
  });
});

describe('guardValuesUnderLoad', () => {
  it('When an operation would lower a guarded cell under load, then it keeps its value', () => {
    const current = grid(2, 2, [50, 50, 90, 90]);
    const next = grid(2, 2, [40, 40, 80, 89.5]);
    const guarded = Uint8Array.from([1, 1, 1, 0]);
    const out = guardValuesUnderLoad(current, next, [60, 100], guarded, defaultLoadGuard());
    // Row 0 is part load; [1][0] is held; [1][1] was not guarded (the user set it).
    expect(Array.from(out.values.data)).toEqual([40, 40, 90, 89.5]);
    expect(out.heldCount).toBe(1);
  });
});

describe('estimateBaro', () => {
  const log = (channels: ColumnarLog['channels'], length: number): ColumnarLog =>
    ({ length, channels }) as ColumnarLog;
  const filled = (n: number, value: (i: number) => number) =>
    Float64Array.from({ length: n }, (_, i) => value(i));

  it('When a barometer is logged, then its median is used', () => {
    const baro = filled(100, (i) => (i === 3 ? 500 : 88 + (i % 3)));
    expect(estimateBaro([log({ baro }, 100)])).toEqual({ kpa: 89, source: 'logged' });
  });

  it('When the engine stood still for a while, then MAP then is the barometer', () => {
    const rpm = filled(100, (i) => (i < 30 ? 0 : 3000));
    const map = filled(100, (i) => (i < 30 ? 84.5 : 60));
    expect(estimateBaro([log({ rpm, map }, 100)])).toEqual({ kpa: 84.5, source: 'engine_off' });
  });

  it('When neither is there, then the standard atmosphere is assumed and said', () => {
    const rpm = filled(100, () => 3000);
    const map = filled(100, () => 60);
    expect(estimateBaro([log({ rpm, map }, 100)])).toEqual({
      kpa: STANDARD_BARO_KPA,
      source: 'assumed',
    });
  });
});
