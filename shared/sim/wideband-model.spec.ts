import { createSeededRandom } from './seeded-random';
import { createSimWideband, transportDelayS, type WidebandOptions } from './wideband-model';

describe('transportDelayS', () => {
  it('When idling (3.2 g/s), then the total is within 0.3–0.5 s; at high load (50 g/s), 0.1–0.2 s', () => {
    // common practice, no published source (reference.md §6: totals 0.3–0.5 s at idle,
    // 0.1–0.2 s at high load)
    expect(transportDelayS(3.2)).toBeGreaterThanOrEqual(0.3);
    expect(transportDelayS(3.2)).toBeLessThanOrEqual(0.5);
    expect(transportDelayS(50)).toBeGreaterThanOrEqual(0.1);
    expect(transportDelayS(50)).toBeLessThanOrEqual(0.2);
  });

  it('When given τ₀ and K, then τ = τ₀ + K/ṁ', () => {
    // computed from the formulas (reference.md §6 simplified model) [C]
    expect(transportDelayS(20, 0.05, 2)).toBeCloseTo(0.15, 12);
  });
});

describe('createSimWideband', () => {
  it('When the exhaust steps at t = 1 s, then the reading reaches 63.2 % after delay + time constant', () => {
    // computed from the first-order step response 1 − e^(−t/T) at t = T [C]; sensor time
    // constant 75 ms inside the published 50–100 ms (Regitz & Collings 2008, abstract) [S]
    const sensor = createSimWideband({ noiseRel: 0, timeConstantS: 0.075 }, createSeededRandom(1));
    const dt = 0.001;
    const delay = transportDelayS(10);
    let crossed = Number.NaN;
    for (let i = 0; i < 3000; i++) {
      const t = i * dt;
      const reading = sensor.read(t, dt, t >= 1 ? 0.8 : 1.0, 10);
      if (Number.isNaN(crossed) && reading <= 1 - 0.2 * (1 - Math.exp(-1))) crossed = t;
    }
    expect(crossed).toBeCloseTo(1 + delay + 0.075, 2);
  });

  it('When fed fresh air (+∞), then it reads its lean limit', () => {
    const sensor = createSimWideband({ noiseRel: 0 }, createSeededRandom(1));
    let reading = 0;
    for (let i = 0; i < 100; i++)
      reading = sensor.read(i * 0.05, 0.05, Number.POSITIVE_INFINITY, 2);
    expect(reading).toBe(1.6);
  });

  it('When its ceiling is set to 1.36, then fresh air reads 1.36 and noise never reads leaner', () => {
    const sensor = createSimWideband({ maxLambda: 1.36 }, createSeededRandom(2));
    const readings: number[] = [];
    for (let i = 0; i < 400; i++)
      readings.push(sensor.read(i * 0.05, 0.05, Number.POSITIVE_INFINITY, 2));
    const settled = readings.slice(100);
    expect(Math.max(...settled)).toBe(1.36);
    // Noise of 0.4 % (1σ) pulls some readings under the ceiling, none by more than 2 % (5σ).
    expect(settled.filter((v) => v === 1.36).length).toBeGreaterThan(100);
    expect(Math.min(...settled)).toBeGreaterThan(1.36 * 0.98);
  });

  it.each<[string, WidebandOptions]>([
    ['a ceiling below the richest reading', { maxLambda: 0.5 }],
    ['a ceiling that is not a number', { maxLambda: Number.NaN }],
    ['a richest reading of 0', { minLambda: 0 }],
  ])('When the range is impossible (%s), then it throws', (_name, options) => {
    expect(() => createSimWideband(options, createSeededRandom(1))).toThrow(
      /minLambda < maxLambda/,
    );
  });
});
