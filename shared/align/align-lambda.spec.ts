import { type ColumnarLog } from '../core/channels';
import { alignLambda } from './align-lambda';
import { interpolateAtTime } from './interpolate-at-time';

// Times on a 0.125 s grid and delays that are multiples of it are exact in binary, so a shift
// by τ can be checked sample for sample (computed from the formulas, reference.md §6 [C]).
const n = 24;
const time = Float64Array.from({ length: n }, (_, i) => i * 0.125);
const stepAt = (t: number) => (t >= 1.5 ? 0.9 : 1.0);
const log: ColumnarLog = {
  length: n,
  channels: {
    time,
    lambda: time.map(stepAt),
    rpm: new Float64Array(n).fill(2000),
  },
};

describe('alignLambda', () => {
  it('When the airflow is constant, then a lambda step moves earlier by exactly τ', () => {
    // τ = 0.125 + 1 g / 8 g/s = 0.25 s = two samples.
    const airflowGps = new Float64Array(n).fill(8);
    const {
      log: aligned,
      delayS,
      beyondEnd,
    } = alignLambda(log, { tau0S: 0.125, kGrams: 1, airflowGps });
    expect(Array.from(delayS)).toEqual(new Array(n).fill(0.25));
    const lambda = aligned.channels.lambda!;
    for (let i = 0; i < n - 2; i++) expect(lambda[i]).toBe(stepAt(time[i] + 0.25));
    expect(lambda[9]).toBe(1.0); // 1.125 s reads 1.375 s
    expect(lambda[10]).toBe(0.9); // 1.25 s reads 1.5 s, the step
    expect(Number.isNaN(lambda[n - 1]) && Number.isNaN(lambda[n - 2])).toBe(true);
    expect(beyondEnd).toBe(2);
  });

  it('When τ falls between samples, then lambda is interpolated linearly in time', () => {
    const ramp: ColumnarLog = {
      length: n,
      channels: { time, lambda: time.map((t) => 0.8 + 0.1 * t) },
    };
    const { log: aligned } = alignLambda(ramp, { tau0S: 0.05, kGrams: 0 });
    for (let i = 0; i < n - 1; i++)
      expect(aligned.channels.lambda![i]).toBeCloseTo(0.8 + 0.1 * (time[i] + 0.05), 12);
  });

  it('When the airflow varies, then each sample uses its own τ = τ₀ + K/ṁ', () => {
    const airflowGps = Float64Array.from({ length: n }, (_, i) => (i < 12 ? 4 : 40));
    const { delayS, log: aligned } = alignLambda(log, { tau0S: 0.1, kGrams: 1, airflowGps });
    expect(delayS[0]).toBeCloseTo(0.35, 12);
    expect(delayS[20]).toBeCloseTo(0.125, 12);
    expect(aligned.channels.lambda![3]).toBeCloseTo(
      interpolateAtTime(time, log.channels.lambda!, time[3] + 0.35),
      12,
    );
  });

  it('When the airflow is NaN or below the floor, then lambda is NaN or the delay capped', () => {
    const airflowGps = new Float64Array(n).fill(8);
    airflowGps[2] = NaN;
    airflowGps[3] = 0;
    const { log: aligned, delayS } = alignLambda(log, { tau0S: 0.1, kGrams: 1, airflowGps });
    expect(Number.isNaN(aligned.channels.lambda![2])).toBe(true);
    expect(delayS[3]).toBeCloseTo(1.1, 12); // floor 1 g/s
  });

  it('When aligned, then the input log is not changed and other channels are shared', () => {
    const before = Float64Array.from(log.channels.lambda!);
    const { log: aligned } = alignLambda(log, { kGrams: 0 });
    expect(log.channels.lambda).toEqual(before);
    expect(aligned.channels.rpm).toBe(log.channels.rpm);
    expect(aligned.channels.lambda).not.toBe(log.channels.lambda);
  });

  it.each<[string, () => unknown, RegExp]>([
    ['no airflow source', () => alignLambda(log), /airflowGps, or displacementL/],
    [
      'airflow of the wrong length',
      () => alignLambda(log, { airflowGps: new Float64Array(3) }),
      /airflowGps has 3/,
    ],
    ['negative τ₀', () => alignLambda(log, { tau0S: -1, kGrams: 0 }), /tau0S/],
    ['zero displacement', () => alignLambda(log, { displacementL: 0 }), /displacementL/],
    [
      'time going back',
      () =>
        alignLambda(
          { length: 2, channels: { time: Float64Array.from([1, 0]), lambda: new Float64Array(2) } },
          { kGrams: 0 },
        ),
      /ascend/,
    ],
    [
      'no lambda',
      () => alignLambda({ length: 1, channels: { time: new Float64Array(1) } }, { kGrams: 0 }),
      /"lambda"/,
    ],
  ])('When given %s, then it throws naming it', (_name, call, message) => {
    expect(call).toThrow(message);
  });
});
