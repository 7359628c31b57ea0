import { accumulateCells } from '../../shared/accumulate';
import { flagLeanCells, proposeTable } from '../../shared/correct';

/** One cell's worth of identical samples at (2000 rpm, 100 kPa) on a 2×2 table. */
function oneCell(lambda: number, target: number, stft: number, ltft: number, samples = 10) {
  const fill = (v: number) => new Float64Array(samples).fill(v);
  return accumulateCells({
    rpmAxis: [2000, 3000],
    mapAxisKpa: [100, 150],
    rpm: fill(2000),
    mapKpa: fill(100),
    lambda: fill(lambda),
    lambdaTarget: fill(target),
    stft: fill(stft),
    ltft: fill(ltft),
  });
}

const base = { rows: 2, cols: 2, data: Float64Array.from([80, 80, 80, 80]) };

describe('VE correction from lambda', () => {
  it('When VE 80 measures λ 0.90 against 0.85 at full step, then VE becomes 84.706', () => {
    // Source: computed from the formulas (reference.md §2) [C]
    const proposal = proposeTable(base, oneCell(0.9, 0.85, 0, 0), { stepFraction: 1 });
    expect(proposal.values.data[0]).toBeCloseTo(84.706, 3);
    expect(proposal.status[0]).toBe('trusted');
  });

  it('When the same cell takes a half step, then VE becomes 82.353', () => {
    // Source: computed from the formulas (reference.md §2), step 0.5 [C]; 50 % per round is
    // common practice, no published source (reference.md §7)
    const proposal = proposeTable(base, oneCell(0.9, 0.85, 0, 0));
    expect(proposal.values.data[0]).toBeCloseTo(82.353, 3);
    expect(proposal.changePercent.data[0]).toBeCloseTo(2.941, 3);
  });

  it('When closed loop holds λ on target with STFT +5 % and LTFT +3 %, then VE becomes 86.52', () => {
    // Source: computed from the formulas (reference.md §2): 80 · 1.05 · 1.03 [C]
    const proposal = proposeTable(base, oneCell(1, 1, 5, 3), { stepFraction: 1 });
    expect(proposal.values.data[0]).toBeCloseTo(86.52, 2);
  });

  it('When a correction exceeds the per-step cap, then the change stops at +15 %', () => {
    // common practice, no published source: cap each step at ±10–15 % (reference.md §7)
    const proposal = proposeTable(base, oneCell(1.3, 1, 0, 0), { stepFraction: 1 });
    expect(proposal.values.data[0]).toBeCloseTo(92, 10);
    expect(proposal.clamped[0]).toBe(1);
  });

  it('When a cell holds less than 5 weighted samples, then it is not trusted', () => {
    // common practice, no published source: ≥ 5–20 weighted hits per cell (reference.md §7)
    const proposal = proposeTable(base, oneCell(0.9, 0.85, 0, 0, 4));
    expect(proposal.status[0]).toBe('too_little_data');
    expect(proposal.values.data[0]).toBe(80);
  });
});

describe('lean under load', () => {
  it('When a loaded cell runs more than 5 % lean, then it is flagged with its size', () => {
    // common practice, no published source: warn at > 5 % lean, abort at ≥ 10 % (reference.md §7)
    const warn = flagLeanCells(oneCell(0.844, 0.8, 0, 0));
    expect(warn).toHaveLength(1);
    expect(warn[0]?.leanPercent).toBeCloseTo(5.5, 10);
    expect(warn[0]?.severity).toBe('warn');
    expect(flagLeanCells(oneCell(0.88, 0.8, 0, 0))[0]?.severity).toBe('abort');
    expect(flagLeanCells(oneCell(0.836, 0.8, 0, 0))).toHaveLength(0);
  });
});
