import { accumulateCells, type AccumulateInput } from './accumulate-cells';

const rpmAxis = [1000, 2000, 3000];
const mapAxisKpa = [40, 70, 100];

function samples(rows: number[][]): AccumulateInput {
  // [rpm, map, lambda, target, stft, ltft]
  const col = (j: number) => Float64Array.from(rows.map((r) => r[j] as number));
  return {
    rpmAxis,
    mapAxisKpa,
    rpm: col(0),
    mapKpa: col(1),
    lambda: col(2),
    lambdaTarget: col(3),
    stft: col(4),
    ltft: col(5),
  };
}

const at = (data: Float64Array, row: number, col: number) => data[row * 3 + col] as number;

describe('accumulateCells', () => {
  it('When a sample sits on a breakpoint, then all its weight lands on that one cell', () => {
    const out = accumulateCells(samples([[2000, 70, 0.9, 0.85, 0, 0]]));
    // computed from the formulas (reference.md §2): r = 0.90/0.85 [C]
    expect(at(out.weight.data, 1, 1)).toBe(1);
    expect(at(out.count.data, 1, 1)).toBe(1);
    expect(at(out.ratio.data, 1, 1)).toBeCloseTo(0.9 / 0.85, 14);
    expect(out.count.data.reduce((a, b) => a + b, 0)).toBe(1);
    expect(at(out.ratio.data, 0, 0)).toBeNaN();
  });

  it('When a sample sits between breakpoints, then the four weights are bilinear and sum to 1', () => {
    const out = accumulateCells(samples([[1250, 55, 1, 1, 0, 0]]));
    // f = (0.25, 0.5): 0.375 / 0.125 / 0.375 / 0.125 — computed from the formulas (§8) [C]
    expect(at(out.weight.data, 0, 0)).toBeCloseTo(0.375, 15);
    expect(at(out.weight.data, 0, 1)).toBeCloseTo(0.125, 15);
    expect(at(out.weight.data, 1, 0)).toBeCloseTo(0.375, 15);
    expect(at(out.weight.data, 1, 1)).toBeCloseTo(0.125, 15);
    expect(out.count.data.reduce((a, b) => a + b, 0)).toBe(4);
  });

  it('When a sample lies beyond the axes, then it is clamped onto the edge cells', () => {
    const out = accumulateCells(samples([[9000, 10, 1, 1, 0, 0]]));
    expect(at(out.weight.data, 0, 2)).toBe(1);
    expect(out.weight.data.reduce((a, b) => a + b, 0)).toBe(1);
  });

  it('When trims are present, then they multiply the ratio; blank trims count as 0', () => {
    const out = accumulateCells(samples([[1000, 40, 1, 1, 5, 3]]));
    // computed from the formulas (reference.md §2): 1.05 · 1.03 [C]
    expect(at(out.ratio.data, 0, 0)).toBeCloseTo(1.0815, 14);
    const blank = accumulateCells(samples([[1000, 40, 1.1, 1, NaN, NaN]]));
    expect(at(blank.ratio.data, 0, 0)).toBeCloseTo(1.1, 14);
  });

  it('When two samples share a cell, then mean, spread and n_eff are the weighted ones', () => {
    const out = accumulateCells(
      samples([
        [1000, 40, 1.1, 1, 0, 0],
        [1000, 40, 0.9, 1, 0, 0],
        [1500, 40, 1.3, 1, 0, 0], // weight 0.5 on (0,0) and on (0,1)
      ]),
    );
    // Weighted by hand: W = 2.5, mean = (1.1 + 0.9 + 0.65)/2.5 = 1.06;
    // var = (0.04² + 0.16² + 0.5·0.24²)/2.5; n_eff = 2.5²/2.25 (Kish) — computed from the formulas [C]
    expect(at(out.weight.data, 0, 0)).toBeCloseTo(2.5, 14);
    expect(at(out.count.data, 0, 0)).toBe(3);
    expect(at(out.ratio.data, 0, 0)).toBeCloseTo(1.06, 14);
    const variance = (0.04 ** 2 + 0.16 ** 2 + 0.5 * 0.24 ** 2) / 2.5;
    expect(at(out.spread.data, 0, 0)).toBeCloseTo(Math.sqrt(variance), 14);
    expect(at(out.effectiveCount.data, 0, 0)).toBeCloseTo(6.25 / 2.25, 14);
    expect(at(out.lambdaMeasured.data, 0, 0)).toBeCloseTo(1.06, 14);
    expect(at(out.lambdaCommanded.data, 0, 0)).toBeCloseTo(1, 14);
  });

  it('When samples are under load, then worstLean is their largest lean excursion', () => {
    const input = samples([
      [3000, 100, 0.88, 0.8, 0, 0], // 10 % lean at 100 kPa
      [3000, 100, 0.82, 0.8, 0, 0],
      [1000, 40, 1.2, 1, 0, 0], // 20 % lean, but at 40 kPa: cruise
    ]);
    const out = accumulateCells(input);
    expect(at(out.worstLean.data, 2, 2)).toBeCloseTo(0.1, 14);
    expect(at(out.worstLean.data, 0, 0)).toBeNaN();
    expect(at(accumulateCells(input, { leanLoadKpa: 0 }).worstLean.data, 0, 0)).toBeCloseTo(0.2);
  });

  it('When keep, sampleWeight and bad values are given, then only good kept samples count', () => {
    const input = samples([
      [1000, 40, 1.1, 1, 0, 0],
      [1000, 40, 0.5, 1, 0, 0],
      [1000, 40, NaN, 1, 0, 0],
      [1000, 40, 1, 0, 0, 0],
    ]);
    const out = accumulateCells({
      ...input,
      keep: Uint8Array.from([1, 0, 1, 1]),
      sampleWeight: Float64Array.from([0.05, 0.05, 0.05, 0.05]),
    });
    expect(out.samplesUsed).toBe(1);
    expect(out.samplesSkipped).toBe(2);
    expect(at(out.weight.data, 0, 0)).toBeCloseTo(0.05, 15);
    expect(at(out.ratio.data, 0, 0)).toBeCloseTo(1.1, 14);
  });

  it('When logs ran another revision, then ratios are re-expressed against the edited table', () => {
    const input = samples([[1000, 40, 1.1, 1, 0, 0]]);
    const veEditing = { rows: 3, cols: 3, data: new Float64Array(9).fill(88) };
    const out = accumulateCells({ ...input, veUsed: Float64Array.from([80]), veEditing });
    // Implied VE = 80 · 1.1 = 88 = what the edited table already holds: no correction left.
    expect(at(out.ratio.data, 0, 0)).toBeCloseTo(1, 14);
    expect(at(out.lambdaError.data, 0, 0)).toBeCloseTo(0.1, 14);
  });

  it('When inputs are malformed, then the error names the argument', () => {
    const good = samples([[1000, 40, 1, 1, 0, 0]]);
    expect(() => accumulateCells({ ...good, lambda: new Float64Array(2) })).toThrow(
      'input.lambda has 2 samples',
    );
    expect(() => accumulateCells({ ...good, rpmAxis: [2, 1] })).toThrow('input.rpmAxis');
    expect(() => accumulateCells({ ...good, keep: new Uint8Array(3) })).toThrow('input.keep');
    expect(() => accumulateCells({ ...good, veUsed: new Float64Array(1) })).toThrow(
      'input.veUsed and input.veEditing',
    );
    expect(() => accumulateCells(good, { leanLoadKpa: NaN })).toThrow('options.leanLoadKpa');
  });

  it('When called, then the input arrays are left untouched', () => {
    const input = samples([[1500, 55, 0.9, 0.85, 2, 1]]);
    const before = Array.from(input.lambda);
    accumulateCells(input);
    expect(Array.from(input.lambda)).toEqual(before);
  });
});
