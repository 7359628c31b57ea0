import { type ColumnarLog } from '../core/channels';
import { DEMO_HATCH, ecuVeTable, simulateLog } from '../sim';
import { prepareLog } from './prepare-log';

const vehicle = DEMO_HATCH;
const options = { ecuTable: ecuVeTable(vehicle), displacementL: vehicle.engine.displacementL };

/** The log without its fuel-cut flag, as many road logs come. */
function withoutFlag(log: ColumnarLog): ColumnarLog {
  const channels = { ...log.channels };
  delete channels.fuelCut;
  return { length: log.length, channels };
}

describe('prepareLog on road logs whose wideband tops out low', () => {
  it.each([1.3, 1.36, 1.45])(
    'When the log has no fuel-cut flag and a %s ceiling, then the filter keeps what the flag would let it keep',
    (ceiling) => {
      const log = simulateLog({ kind: 'road', seed: 7, wideband: { maxLambda: ceiling } });
      const withFlag = prepareLog(log, options);
      const fromLog = prepareLog(withoutFlag(log), options);
      const step = fromLog.funnel.find((s) => s.rule === 'fuelCut');
      expect(step?.detail?.ceilingLambda).toBeCloseTo(ceiling, 9);
      expect(step?.label).toContain(`ceiling ${ceiling}`);
      // After alignment and every default rule, the flag removes nothing the log's own ceiling
      // misses beyond a few samples (short gear-change cuts).
      let keptOnlyWithoutFlag = 0;
      let kept = 0;
      for (let i = 0; i < log.length; i++) {
        kept += fromLog.keep[i]!;
        if (fromLog.keep[i] === 1 && withFlag.keep[i] === 0) keptOnlyWithoutFlag++;
      }
      expect(kept).toBeGreaterThan(3000);
      expect(keptOnlyWithoutFlag).toBeLessThan(0.005 * kept);
    },
  );
});
