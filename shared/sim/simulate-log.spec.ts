import { CHANNELS } from '../core/channels';
import { locate } from '../core/lookup';
import { roadSpeedKph } from '../physics/road-speed';
import { DEMO_HATCH, DEMO_ROADSTER } from './demo-vehicles';
import { type DynoHold } from './dyno-operator';
import { type SimSample } from './sim-sample';
import { simulateLog, simulateSamples } from './simulate-log';
import { ecuVeTable, trueVeTable } from './ve-surface';
import { transportDelayS } from './wideband-model';

const road: SimSample[] = [...simulateSamples({ kind: 'road', seed: 7, durationS: 600 })];

describe('simulateLog: determinism and shape', () => {
  it('When run twice with one seed, then the logs are identical; another seed differs', () => {
    const a = simulateLog({ kind: 'road', seed: 5, durationS: 120 });
    const b = simulateLog({ kind: 'road', seed: 5, durationS: 120 });
    const c = simulateLog({ kind: 'road', seed: 6, durationS: 120 });
    for (const channel of CHANNELS) expect(b.channels[channel]).toEqual(a.channels[channel]);
    expect(c.channels.lambda).not.toEqual(a.channels.lambda);
  });

  it('When 50 Hz for 30 s, then 1500 samples 20 ms apart in every channel', () => {
    const log = simulateLog({ kind: 'dyno', sampleRateHz: 50, durationS: 30 });
    expect(log.length).toBe(1500);
    const time = log.channels.time!;
    expect(time[1]! - time[0]!).toBeCloseTo(0.02, 12);
    for (const data of Object.values(log.channels)) expect(data.length).toBe(1500);
    for (const channel of ['time', 'rpm', 'map', 'lambda', 'lambdaTarget'] as const) {
      expect(log.channels[channel]).toBeInstanceOf(Float64Array);
    }
  });

  it.each([
    [{ sampleRateHz: 0 }, 'sampleRateHz'],
    [{ sampleRateHz: 5000 }, 'sampleRateHz'],
    [{ durationS: -1 }, 'durationS'],
    [{ baroKpa: Number.NaN }, 'baroKpa'],
  ])('When options are invalid (%#), then it throws naming %s', (options, name) => {
    expect(() => simulateLog(options)).toThrow(name);
  });
});

describe('simulateLog: the physics shows in the log', () => {
  it('When a boosted cell is held open loop, then λ ≈ target × trueVE/ecuVE within 1.5 %', () => {
    // computed from the formulas: λ = λ_cmd · VE_true / VE_ecu with no trims (reference.md §2) [C]
    const holds: DynoHold[] = [
      { kind: 'hold', rpm: 3200, mapKpa: 150, settleS: 4, holdS: 6 },
      { kind: 'hold', rpm: 4000, mapKpa: 150, settleS: 4, holdS: 6 },
      { kind: 'hold', rpm: 2400, mapKpa: 100, settleS: 4, holdS: 6 },
    ];
    const samples = [...simulateSamples({ kind: 'dyno', holds, durationS: 60, seed: 3 })];
    const truth = trueVeTable(DEMO_HATCH);
    const ecu = ecuVeTable(DEMO_HATCH);
    for (const hold of holds) {
      const steady = samples.filter(
        (s) =>
          Math.abs(s.rpm - hold.rpm) < 20 &&
          Math.abs(s.truth.mapKpa - hold.mapKpa) < 1 &&
          s.closedLoop === 0 &&
          s.truth.enrichment < 1.001,
      );
      expect(steady.length).toBeGreaterThan(60);
      const col = locate(truth.rpmAxis, hold.rpm).i + locate(truth.rpmAxis, hold.rpm).f;
      const row = locate(truth.mapAxisKpa, hold.mapKpa).i + locate(truth.mapAxisKpa, hold.mapKpa).f;
      const ratio = truth.values[row]![col]! / ecu.values[row]![col]!;
      const measured =
        steady.reduce((s, x) => s + x.lambdaMeasured / x.lambdaTarget, 0) / steady.length;
      expect(Math.abs(measured / ratio - 1)).toBeLessThan(0.015);
    }
  });

  it('When the throttle is closed at high rpm, then fuel is cut and the sensor reads its lean limit', () => {
    const cut = road.filter((s) => s.fuelCut === 1);
    expect(cut.length).toBeGreaterThan(20);
    for (const s of cut) {
      expect(s.tpsPct).toBeLessThan(1);
      expect(s.rpm).toBeGreaterThan(1150);
    }
    const settledCut = road.filter((s, i) => s.fuelCut === 1 && road[i - 30]?.fuelCut === 1);
    expect(settledCut.length).toBeGreaterThan(0);
    for (const s of settledCut) expect(s.lambdaMeasured).toBeGreaterThan(1.5);
  });

  it('When the wideband tops out at 1.36, then cuts read 1.36 and no reading is leaner', () => {
    const low = [...simulateSamples({ kind: 'road', seed: 7, wideband: { maxLambda: 1.36 } })];
    expect(Math.max(...low.map((s) => s.lambdaMeasured))).toBe(1.36);
    // The ceiling changes only the reading: the drive and the cuts are the default log's.
    expect(low.map((s) => s.fuelCut)).toEqual(road.map((s) => s.fuelCut));
    const settledCut = low.filter((s, i) => s.fuelCut === 1 && low[i - 30]?.fuelCut === 1);
    expect(settledCut.length).toBeGreaterThan(0);
    for (const s of settledCut) expect(s.lambdaMeasured).toBeGreaterThan(1.36 * 0.98);
  });

  it('When the ceiling is given as the default 1.6, then the log is the default log', () => {
    const a = simulateLog({ kind: 'road', seed: 4, durationS: 120 });
    const b = simulateLog({ kind: 'road', seed: 4, durationS: 120, wideband: { maxLambda: 1.6 } });
    for (const channel of CHANNELS) expect(b.channels[channel]).toEqual(a.channels[channel]);
  });

  it('When fuel is cut, then the reading rises only after the transport delay', () => {
    // computed from the formulas: τ = τ₀ + K/ṁ (reference.md §6) [C]
    let onsets = 0;
    road.forEach((s, i) => {
      if (s.fuelCut !== 1 || road[i - 1]?.fuelCut !== 0) return;
      if (!road.slice(i, i + 20).every((x) => x.fuelCut === 1)) return; // cuts of at least 1 s
      const rise = road.slice(i).findIndex((x) => x.lambdaMeasured > 1.3);
      if (rise < 0 || i + rise >= road.length) return;
      const delayS = road[i + rise]!.timeS - s.timeS;
      const expected = transportDelayS(road[i - 1]!.truth.airGps);
      expect(delayS).toBeGreaterThanOrEqual(expected - 0.05);
      expect(delayS).toBeLessThan(expected + 0.4);
      onsets++;
    });
    expect(onsets).toBeGreaterThan(0);
  });

  it('When the engine is cold, then warm-up enrichment makes it run richer than commanded', () => {
    const cold = road.filter((s) => s.ectC < 45 && s.closedLoop === 0 && s.fuelCut === 0);
    expect(cold.length).toBeGreaterThan(100);
    const mean = cold.reduce((sum, s) => sum + s.lambdaMeasured / s.lambdaTarget, 0) / cold.length;
    expect(mean).toBeLessThan(0.92);
  });

  it('When closed loop, then only at stoichiometric targets on a warm engine, pulled to target', () => {
    const closed = road.filter((s) => s.closedLoop === 1);
    expect(closed.length).toBeGreaterThan(1000);
    for (const s of closed) {
      expect(s.lambdaTarget).toBeGreaterThanOrEqual(0.995);
      expect(s.ectC).toBeGreaterThanOrEqual(65);
    }
    const mean =
      closed.reduce((sum, s) => sum + s.lambdaMeasured / s.lambdaTarget, 0) / closed.length;
    expect(Math.abs(mean - 1)).toBeLessThan(0.02);
    expect(road.filter((s) => s.closedLoop === 0).every((s) => s.stftPct === 0)).toBe(true);
  });
});

describe('simulateLog: the vehicle behaves', () => {
  it('When driving on the road, then speed stays under the cap and rpm under the redline', () => {
    const samples = [
      ...simulateSamples({ kind: 'road', vehicle: DEMO_ROADSTER, speedCapKph: 90, seed: 2 }),
    ];
    expect(Math.max(...samples.map((s) => s.speedKph))).toBeLessThanOrEqual(90);
    expect(Math.max(...samples.map((s) => s.speedKph))).toBeGreaterThan(50);
    expect(Math.max(...samples.map((s) => s.rpm))).toBeLessThanOrEqual(
      DEMO_ROADSTER.redlineRpm + 200,
    );
    expect(new Set(samples.map((s) => s.gear)).size).toBeGreaterThanOrEqual(4);
    // A naturally aspirated engine never makes boost.
    expect(Math.max(...samples.map((s) => s.truth.mapKpa))).toBeLessThanOrEqual(101.3);
  });

  it('When on the dyno, then the gear is fixed and the roller speed matches the gearing', () => {
    // computed from the formulas: v = 0.06·N·π·D/(i_gear·i_final) (reference.md §9) [C]
    const samples = [...simulateSamples({ kind: 'dyno', durationS: 60 })];
    const { tireDiameterMm, gearRatios, finalDrive } = DEMO_HATCH.gearing;
    for (const s of samples.slice(100)) {
      expect(s.gear).toBe(4);
      const underlying = roadSpeedKph(
        Math.max(0, s.rpm),
        tireDiameterMm / 1000,
        gearRatios[3]!,
        finalDrive,
      );
      expect(Math.abs(s.speedKph - underlying)).toBeLessThan(1); // rpm carries a few rpm of wander
    }
  });
});
