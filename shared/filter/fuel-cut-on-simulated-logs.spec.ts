import { type ColumnarLog } from '../core/channels';
import {
  DEMO_HATCH,
  type DynoHold,
  lambdaTargetTable,
  samplesToLog,
  type SimSample,
  simulateSamples,
  transportDelayS,
  type WidebandOptions,
} from '../sim';
import { DEFAULT_FILTER_RULES, type FilterRule } from './filter-rules';
import { filterSamples } from './filter-samples';
import { detectLambdaCeiling } from './lambda-ceiling';

/** The simulator's wideband settings (its defaults, written out for the truth below). */
const SENSOR = { fixedDelayS: 0.1, flowDelayG: 1.0, timeConstantS: 0.075 };
const FUEL_CUT: FilterRule = { kind: 'fuelCut' };

/** The log without the channels named: road logs from the field often lack the fuel-cut flag. */
function without(samples: readonly SimSample[], ...names: ('fuelCut' | 'tps')[]): ColumnarLog {
  const log = samplesToLog(samples);
  const channels = { ...log.channels };
  for (const name of names) delete channels[name];
  return { length: log.length, channels };
}

/**
 * The simulator's own truth of which readings a fuel cut spoils: the reading at t shows the gas
 * that left the cylinders τ = τ₀ + K/ṁ earlier (the wideband model's delay, at the flow of t)
 * through a first-order lag; after 4 time constants less than 2 % (e^−4) of a step remains. So
 * a reading is spoilt when any sample of the flag's cut lies in [t − τ − 4T, t − τ] (computed
 * from the model's formulas [C]). `minCutS` leaves out cuts shorter than that.
 */
function spoiltByCut(samples: readonly SimSample[], minCutS = 0): Uint8Array {
  const n = samples.length;
  const dtS = samples[1]!.timeS - samples[0]!.timeS;
  const inCut = new Uint8Array(n);
  for (let i = 0; i < n;) {
    if (samples[i]!.fuelCut !== 1) {
      i++;
      continue;
    }
    let j = i;
    while (j < n && samples[j]!.fuelCut === 1) j++;
    if ((j - i) * dtS >= minCutS) inCut.fill(1, i, j);
    i = j;
  }
  const cutBefore = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) cutBefore[i + 1] = cutBefore[i]! + inCut[i]!;
  const out = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const s = samples[i]!;
    const tau = transportDelayS(s.truth.airGps, SENSOR.fixedDelayS, SENSOR.flowDelayG);
    const last = Math.floor((s.timeS - tau) / dtS + 1e-9);
    const first = Math.max(0, Math.ceil((s.timeS - tau - 4 * SENSOR.timeConstantS) / dtS - 1e-9));
    if (last >= first && cutBefore[last + 1]! - cutBefore[first]! > 0) out[i] = 1;
  }
  return out;
}

/** How many samples are marked in `marks` and kept by `keep`. */
function keptOf(marks: Uint8Array, keep: Uint8Array): number {
  let count = 0;
  for (let i = 0; i < marks.length; i++) if (marks[i] === 1 && keep[i] === 1) count++;
  return count;
}

/** How many samples are marked. */
function countOf(marks: Uint8Array): number {
  return marks.reduce((sum, m) => sum + m, 0);
}

describe.each([1.3, 1.36, 1.45, 1.6])(
  'fuel cut on a simulated 10 min road log whose wideband tops out at λ %s, without the flag',
  (ceiling) => {
    const wideband: WidebandOptions = { ...SENSOR, maxLambda: ceiling };
    const samples = [...simulateSamples({ kind: 'road', seed: 7, durationS: 600, wideband })];
    const log = without(samples, 'fuelCut');
    const spoilt = spoiltByCut(samples);

    it('When the ceiling is looked for, then it is the sensor’s own', () => {
      expect(detectLambdaCeiling(log)?.lambda).toBeCloseTo(ceiling, 9);
      if (ceiling < 1.6) {
        // The fixed limit alone (the rule before the ceiling was looked for) sees no cut at all.
        expect(log.channels.lambda!.some((v) => v >= 1.6)).toBe(false);
      }
    });

    it('When the fuel-cut rule runs, then every reading a real cut spoils goes and the funnel names the ceiling', () => {
      const { keep, funnel } = filterSamples(log, [FUEL_CUT]);
      expect(funnel[0]!.detail?.ceilingLambda).toBeCloseTo(ceiling, 9);
      expect(funnel[0]!.label).toContain(`lambda at the log's ceiling ${ceiling}`);
      // Cuts of 0.25 s or more (the overruns): nothing they spoil is kept.
      expect(countOf(spoiltByCut(samples, 0.25))).toBeGreaterThan(1000);
      expect(keptOf(spoiltByCut(samples, 0.25), keep)).toBe(0);
      // What is left comes from cut blips of a sample or two during gear changes, whose reading
      // stays far under the ceiling: under 1 % of all spoilt readings.
      expect(keptOf(spoilt, keep)).toBeLessThan(0.01 * countOf(spoilt));
    });

    it('When the fuel-cut rule runs, then it removes nothing far from a real cut', () => {
      // A removed sample lies at most 0.5 s before a cut sample (the climb into cut must reach
      // λ 1.15 within 0.5 s) and at most 2 s after one (delay + lag + the 1 s settle).
      const { keep } = filterSamples(log, [FUEL_CUT]);
      const cutTimes = samples.filter((s) => s.fuelCut === 1).map((s) => s.timeS);
      let c = 0;
      samples.forEach((s, i) => {
        if (keep[i] === 1) return;
        while (c + 1 < cutTimes.length && cutTimes[c + 1]! <= s.timeS + 0.5) c++;
        expect(s.timeS - cutTimes[c]!).toBeLessThanOrEqual(2);
        expect(cutTimes[c]! - s.timeS).toBeLessThanOrEqual(0.5);
      });
    });

    it('When the default rules run, then no spoilt reading is kept', () => {
      const { keep } = filterSamples(log, DEFAULT_FILTER_RULES);
      expect(keptOf(spoilt, keep)).toBe(0);
    });
  },
);

describe('fuel cut on simulated logs that must keep behaving', () => {
  it('When the log has the flag and the simulator’s 1.6 ceiling, then flag and ceiling both hold', () => {
    const samples = [...simulateSamples({ kind: 'road', seed: 3, durationS: 600 })];
    const { keep, funnel } = filterSamples(samplesToLog(samples), [FUEL_CUT]);
    expect(funnel[0]!.detail?.ceilingLambda).toBe(1.6);
    expect(keptOf(spoiltByCut(samples), keep)).toBe(0);
    samples.forEach((s, i) => {
      if (s.fuelCut === 1) expect(keep[i]).toBe(0);
    });
  });

  it('When the road log has neither the flag nor the throttle, then the ceiling is still found', () => {
    const wideband = { ...SENSOR, maxLambda: 1.36 };
    const samples = [...simulateSamples({ kind: 'road', seed: 3, durationS: 600, wideband })];
    const { keep, funnel } = filterSamples(without(samples, 'fuelCut', 'tps'), [FUEL_CUT]);
    expect(funnel[0]!.detail?.ceilingLambda).toBe(1.36);
    // Without a throttle, a cut too short for the reading to reach the ceiling (0.45 s at a gear
    // change) looks like any lean spike; the overruns, 1 s and longer, still go whole.
    expect(countOf(spoiltByCut(samples, 1))).toBeGreaterThan(1000);
    expect(keptOf(spoiltByCut(samples, 1), keep)).toBe(0);
  });

  // Steady cruise on the dyno: three light-load holds of a minute, no overrun, no cut.
  const cruiseHolds: DynoHold[] = [
    { kind: 'hold', rpm: 2000, mapKpa: 50, settleS: 3, holdS: 60 },
    { kind: 'hold', rpm: 2500, mapKpa: 60, settleS: 3, holdS: 60 },
    { kind: 'hold', rpm: 3000, mapKpa: 55, settleS: 3, holdS: 60 },
  ];
  const stoich = lambdaTargetTable(DEMO_HATCH);
  const leanCruise = (target: number) => ({
    ...stoich,
    values: stoich.values.map((row) => row.map(() => target)),
  });

  it.each<[string, number | null, readonly ('fuelCut' | 'tps')[]]>([
    ['stoichiometric', null, ['fuelCut']],
    ['lean at λ 1.2', 1.2, ['fuelCut']],
    ['lean at λ 1.2, no throttle channel', 1.2, ['fuelCut', 'tps']],
    ['lean at λ 1.3, no throttle channel', 1.3, ['fuelCut', 'tps']],
  ])(
    'When a steady cruise (%s) has no overrun, then the fuel-cut rule removes nothing',
    (_name, target, dropped) => {
      const samples = [
        ...simulateSamples({
          kind: 'dyno',
          holds: cruiseHolds,
          durationS: 200,
          seed: 5,
          wideband: { ...SENSOR, maxLambda: 1.36 },
          ...(target === null ? {} : { lambdaTable: leanCruise(target) }),
        }),
      ];
      expect(samples.some((s) => s.fuelCut === 1)).toBe(false);
      const { funnel } = filterSamples(without(samples, ...dropped), [FUEL_CUT]);
      expect(funnel[0]).toMatchObject({ status: 'applied', removed: 0 });
      expect(funnel[0]!.detail).toBeUndefined();
    },
  );
});
