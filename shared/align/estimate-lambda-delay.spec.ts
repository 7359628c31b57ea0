import { type ColumnarLog } from '../core/channels';
import { estimateLambdaDelay } from './estimate-lambda-delay';
import { findDelayEvents } from './find-delay-events';
import { tipInAnswerLag } from './measure-event-lag';

/** A small seeded generator (LCG) so the synthetic logs are the same on every run. */
function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 4294967296;
  };
}

interface SyntheticOptions {
  tau0S: number;
  kGrams: number;
  sensorTimeConstantS: number;
  /** Airflow held through each 5 s segment, g/s. */
  airflowsGps: number[];
  sampleHz: number;
  seed?: number;
  /** Also set the fuel-cut flag (instead of a commanded step) in the second half of each segment. */
  withFuelCut?: boolean;
}

/**
 * A synthetic log with a known delay: the mixture at the engine is 1.02 × commanded lambda,
 * which steps 1.00 → 0.88 one second into each 5 s segment and back 2.5 s later (at an
 * instant between samples). The gas burnt at t reaches the sensor at t + τ₀ + K/ṁ; the sensor
 * is a first-order lag; it is sampled with ±3 ms jitter and 0.002 noise.
 */
function syntheticLog(o: SyntheticOptions): { log: ColumnarLog; airflowGps: Float64Array } {
  const random = seededRandom(o.seed ?? 7);
  const fineStepS = 0.0005;
  const durationS = 5 * o.airflowsGps.length;
  const stepTimes = o.airflowsGps.map(() => 0.02 * random());
  const segment = (t: number) => Math.min(o.airflowsGps.length - 1, Math.floor(t / 5));
  const flowAt = (t: number) => o.airflowsGps[segment(Math.max(0, t))];
  const inStep = (t: number) => {
    const local = t - 5 * segment(Math.max(0, t)) - stepTimes[segment(Math.max(0, t))];
    return local >= 1 && local < 3.5;
  };
  const isCut = (t: number) => !!o.withFuelCut && inStep(t);
  const targetAt = (t: number) => (!o.withFuelCut && inStep(t) ? 0.88 : 1.0);
  const engineLambdaAt = (t: number) => (isCut(t) ? 2.0 : 1.02 * targetAt(t));
  const fine = new Float64Array(Math.ceil(durationS / fineStepS) + 1);
  const alpha = 1 - Math.exp(-fineStepS / o.sensorTimeConstantS);
  let sensor = 1.02;
  for (let j = 0; j < fine.length; j++) {
    const t = j * fineStepS;
    const input = engineLambdaAt(t - (o.tau0S + o.kGrams / flowAt(t)));
    sensor += (input - sensor) * alpha;
    fine[j] = sensor;
  }
  const n = Math.floor(durationS * o.sampleHz) - 1;
  const time = new Float64Array(n);
  const lambda = new Float64Array(n);
  const lambdaTarget = new Float64Array(n);
  const fuelCut = new Float64Array(n);
  const airflowGps = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / o.sampleHz + 0.003 * (2 * random() - 1) + 0.003;
    const noise = 0.002 * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
    time[i] = t;
    lambda[i] = fine[Math.round(t / fineStepS)] + noise;
    lambdaTarget[i] = targetAt(t);
    fuelCut[i] = isCut(t) ? 1 : 0;
    airflowGps[i] = flowAt(t);
  }
  const channels = o.withFuelCut ? { time, lambda, fuelCut } : { time, lambda, lambdaTarget };
  return { log: { length: n, channels }, airflowGps };
}

// The synthetic logs are built in this file from the model of reference.md §6
// (τ = τ₀ + K/ṁ, first-order sensor); the tolerances are ours (computed from the formulas [C]).
describe('estimateLambdaDelay on synthetic logs with a known delay', () => {
  const airflowsGps = [3, 6, 12, 25, 50, 90];

  it.each([
    [0.1, 1.0, 0.08, 50],
    [0.05, 2.5, 0.1, 25],
    [0.15, 0.6, 0.05, 100],
  ])(
    'When τ₀ = %f s, K = %f g, sensor lag %f s at %i Hz, then both are recovered',
    (tau0S, kGrams, sensorTimeConstantS, sampleHz) => {
      const { log, airflowGps } = syntheticLog({
        tau0S,
        kGrams,
        sensorTimeConstantS,
        airflowsGps,
        sampleHz,
      });
      const estimate = estimateLambdaDelay(log, { airflowGps });
      expect(estimate.method).toBe('tau0AndK');
      expect(estimate.events).toHaveLength(12);
      expect(estimate.events.every((e) => e.status === 'used')).toBe(true);
      expect(Math.abs(estimate.tau0S - tau0S)).toBeLessThan(0.015);
      expect(Math.abs(estimate.kGrams - kGrams) / kGrams).toBeLessThan(0.05);
      // The step's instant is only known to within a sample: RMS misfit under half a period.
      expect(estimate.residualS).toBeLessThan(0.5 / sampleHz);
      expect(estimate.quality).toBe('good');
    },
  );

  it('When the events are fuel-cut edges, then the delay is recovered from them', () => {
    const { log, airflowGps } = syntheticLog({
      tau0S: 0.1,
      kGrams: 1,
      sensorTimeConstantS: 0.08,
      airflowsGps,
      sampleHz: 50,
      withFuelCut: true,
    });
    const estimate = estimateLambdaDelay(log, { airflowGps });
    expect(estimate.events.every((e) => e.kind === 'fuelCutEdge')).toBe(true);
    expect(Math.abs(estimate.tau0S - 0.1)).toBeLessThan(0.015);
    expect(Math.abs(estimate.kGrams - 1) / 1).toBeLessThan(0.05);
  });

  it('When every event has the same airflow, then only τ₀ is fitted and K kept', () => {
    const { log, airflowGps } = syntheticLog({
      tau0S: 0.1,
      kGrams: 1,
      sensorTimeConstantS: 0.08,
      airflowsGps: [20, 20, 20],
      sampleHz: 50,
    });
    const estimate = estimateLambdaDelay(log, { airflowGps, fallbackKGrams: 1 });
    expect(estimate.method).toBe('tau0Only');
    expect(estimate.kGrams).toBe(1);
    expect(Math.abs(estimate.tau0S - 0.1)).toBeLessThan(0.015);
    expect(estimate.quality).toBe('fair');
    expect(estimate.reason).toMatch(/airflow range too narrow/);
  });

  it('When the log has no events, then the defaults come back marked poor', () => {
    const { log, airflowGps } = syntheticLog({
      tau0S: 0.1,
      kGrams: 1,
      sensorTimeConstantS: 0.08,
      airflowsGps: [20],
      sampleHz: 50,
    });
    const flat = {
      ...log,
      channels: { ...log.channels, lambdaTarget: new Float64Array(log.length).fill(1) },
    };
    const estimate = estimateLambdaDelay(flat, { airflowGps });
    expect(estimate).toMatchObject({ method: 'none', quality: 'poor', tau0S: 0.1, kGrams: 1 });
    expect(estimate.events).toHaveLength(0);
  });

  it('When an event is far off the line, then it is set aside as an outlier', () => {
    const { log, airflowGps } = syntheticLog({
      tau0S: 0.1,
      kGrams: 1,
      sensorTimeConstantS: 0.08,
      airflowsGps,
      sampleHz: 50,
    });
    // Claim a much lower airflow around one step only: its lag then sits far off the line.
    const wrongFlow = Float64Array.from(airflowGps, (v, i) =>
      log.channels.time![i] > 20 && log.channels.time![i] < 23 ? 5 : v,
    );
    const estimate = estimateLambdaDelay(log, { airflowGps: wrongFlow });
    expect(estimate.events.filter((e) => e.status === 'outlier')).toHaveLength(1);
    expect(Math.abs(estimate.tau0S - 0.1)).toBeLessThan(0.015);
  });

  it('When no airflow source is given, then it throws naming the options', () => {
    const { log } = syntheticLog({
      tau0S: 0.1,
      kGrams: 1,
      sensorTimeConstantS: 0.08,
      airflowsGps: [20],
      sampleHz: 50,
    });
    expect(() => estimateLambdaDelay(log)).toThrow(/airflowGps, or displacementL/);
  });
});

describe('findDelayEvents', () => {
  const time = Float64Array.from({ length: 100 }, (_, i) => i * 0.1);
  const log = (channels: Record<string, number[]>): ColumnarLog => ({
    length: 100,
    channels: {
      time,
      ...Object.fromEntries(Object.entries(channels).map(([k, v]) => [k, Float64Array.from(v)])),
    },
  });
  const steps = (...at: number[]) =>
    Array.from({ length: 100 }, (_, i) => (at.filter((a) => i >= a).length % 2 === 1 ? 0.85 : 1));

  it('When steps are isolated, then each is an event timed mid-interval', () => {
    const found = findDelayEvents(log({ lambdaTarget: steps(20, 60) }));
    expect(found.map((e) => [e.kind, e.index])).toEqual([
      ['lambdaTargetStep', 20],
      ['lambdaTargetStep', 60],
    ]);
    expect(found[0].causeTimeS).toBeCloseTo(1.95, 12);
  });

  it('When the command ramps over several samples, then it is one event timed half-way', () => {
    const ramp = Array.from({ length: 100 }, (_, i) =>
      i < 30 ? 1 : i < 36 ? 1 - 0.02 * (i - 29) : 0.88,
    );
    const found = findDelayEvents(log({ lambdaTarget: ramp }));
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ kind: 'lambdaTargetStep', index: 30, isStep: false });
    expect(found[0].spanS[0]).toBeCloseTo(2.95, 12);
    expect(found[0].spanS[1]).toBeCloseTo(3.45, 12);
    expect(found[0].causeTimeS).toBeCloseTo(3.15, 12); // 0.94, half of the 0.12, at sample 32
  });

  it('When two steps fall within the isolation time, then neither is kept', () => {
    expect(findDelayEvents(log({ lambdaTarget: steps(20, 25) }))).toHaveLength(0);
  });

  // Changed: a commanded step that comes with a moving throttle used to win over the tip-in.
  // The throttle's transient fuel moves the mixture before the command does, which timed such
  // steps early on simulated logs, so the step is no longer an event and the tip-in remains.
  it('When a tip-in comes with a commanded step, then the step is dropped for the tip-in', () => {
    const tps = Array.from({ length: 100 }, (_, i) =>
      i < 20 ? 10 : i < 23 ? 10 + 25 * (i - 19) : 85,
    );
    const found = findDelayEvents(log({ lambdaTarget: steps(21), tps }));
    expect(found.map((e) => e.kind)).toEqual(['tipIn']);
    const steady = Array.from({ length: 100 }, () => 40);
    expect(
      findDelayEvents(log({ lambdaTarget: steps(21), tps: steady })).map((e) => e.kind),
    ).toEqual(['lambdaTargetStep']);
    expect(findDelayEvents(log({ tps })).map((e) => [e.kind, e.index])).toEqual([['tipIn', 20]]);
  });
});

describe('tipInAnswerLag', () => {
  it('When a tip-in leans the mixture out briefly, then the lag is found within half a sample', () => {
    // Engine mixture goes lean (1.15) for 0.15 s from the tip-in at 2.013 s; the sensor sees it
    // 0.3 s later through a 0.08 s first-order lag; sampled at 50 Hz (computed from the
    // formulas, reference.md §6 [C]).
    const delayS = 0.3;
    const tipS = 2.013;
    const fine = 0.0005;
    const alpha = 1 - Math.exp(-fine / 0.08);
    const sensorAt = new Float64Array(Math.round(5 / fine));
    let y = 1;
    for (let j = 0; j < sensorAt.length; j++) {
      const t = j * fine - delayS;
      y += ((t >= tipS && t < tipS + 0.15 ? 1.15 : 1) - y) * alpha;
      sensorAt[j] = y;
    }
    const time = Float64Array.from({ length: 240 }, (_, i) => i * 0.02);
    const lambda = time.map((t) => sensorAt[Math.round(t / fine)]);
    const lag = tipInAnswerLag(time, lambda, tipS);
    if (!('lagS' in lag)) throw new Error(lag.unmeasured);
    expect(lag.lagS).toBeGreaterThan(delayS - 0.005);
    // Documented: up to half a sample (10 ms) late.
    expect(lag.lagS).toBeLessThan(delayS + 0.01 + 0.002);
  });
});
