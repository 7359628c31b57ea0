import { withValues, tableToGrid, type VeTable } from '../core/table';
import { DEMO_ROADSTER, ecuVeTable, simulateLog } from '../sim';
import { analyseLogs } from './analyse-logs';

const vehicle = DEMO_ROADSTER;
const engine = { displacementL: vehicle.engine.displacementL };

/** The table scaled by `factor` everywhere. */
function scaled(table: VeTable, factor: number): VeTable {
  const grid = tableToGrid(table);
  return withValues(table, { ...grid, data: grid.data.map((v) => v * factor) });
}

describe('analyseLogs', () => {
  const t1 = ecuVeTable(vehicle);
  const t2 = scaled(t1, 1.06);
  const onT1 = simulateLog({ vehicle, kind: 'dyno', seed: 7, ecuTable: t1 });
  const onT2 = simulateLog({ vehicle, kind: 'dyno', seed: 8, ecuTable: t2 });

  it('When logs of another revision are analysed, then corrections refer to the base table', () => {
    const a = analyseLogs(t1, [{ log: onT1, ecuTable: t1 }], engine);
    const b = analyseLogs(t1, [{ log: onT2, ecuTable: t2 }], engine);
    let compared = 0;
    for (let i = 0; i < a.cells.ratio.data.length; i++) {
      if (a.proposal.status[i] !== 'trusted' || b.proposal.status[i] !== 'trusted') continue;
      // Both logs describe the same engine, so both imply the same VE relative to the base.
      expect(
        Math.abs((b.cells.ratio.data[i] as number) / (a.cells.ratio.data[i] as number) - 1),
      ).toBeLessThan(0.01);
      compared++;
    }
    expect(compared).toBeGreaterThan(10);
  });

  it('When the revision a log ran is ignored, then its corrections are off by that revision', () => {
    const wrong = analyseLogs(t1, [{ log: onT2 }], engine);
    const right = analyseLogs(t1, [{ log: onT2, ecuTable: t2 }], engine);
    const i = right.proposal.status.findIndex(
      (s, k) => s === 'trusted' && wrong.proposal.status[k] === 'trusted',
    );
    expect(i).toBeGreaterThanOrEqual(0);
    const ratio = (wrong.cells.ratio.data[i] as number) / (right.cells.ratio.data[i] as number);
    expect(ratio).toBeCloseTo(1 / 1.06, 2);
  });

  it('When logs are analysed, then each reports its funnel and the delay it used', () => {
    const result = analyseLogs(t1, [{ log: onT1 }, { log: onT2, ecuTable: t2 }], engine);
    expect(result.logs).toHaveLength(2);
    for (const contribution of result.logs) {
      expect(contribution.funnel.length).toBeGreaterThan(3);
      expect(contribution.kept).toBeGreaterThan(0);
      expect(contribution.kept).toBeLessThanOrEqual(contribution.samples);
      expect(contribution.delayUsed.tau0S).toBeGreaterThan(0);
    }
    expect(result.cells.samplesUsed).toBe(
      result.logs[0]!.kept + result.logs[1]!.kept - result.cells.samplesSkipped,
    );
  });

  it('When no log is given, then it refuses', () => {
    expect(() => analyseLogs(t1, [], engine)).toThrow(/at least one log/);
  });

  it('When the delay estimate is off, then the settings are used', () => {
    const result = analyseLogs(t1, [{ log: onT1 }], engine, {
      delay: { estimate: false, tau0S: 0.2, kGrams: 0.5 },
    });
    expect(result.logs[0]!.delayUsed).toEqual({ tau0S: 0.2, kGrams: 0.5, source: 'settings' });
    expect(result.logs[0]!.delayEstimate).toBeNull();
  });
});
