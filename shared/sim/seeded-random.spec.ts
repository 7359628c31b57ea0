import { createSeededRandom, createWander } from './seeded-random';

function draw(n: number, next: () => number): number[] {
  return Array.from({ length: n }, next);
}

function meanAndSd(values: number[]): { mean: number; sd: number } {
  const mean = values.reduce((s, v) => s + v, 0) / values.length;
  const variance = values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1);
  return { mean, sd: Math.sqrt(variance) };
}

describe('createSeededRandom', () => {
  it('When seeded alike, then the sequences are identical; when not, they differ', () => {
    const a = createSeededRandom(42);
    const b = createSeededRandom(42);
    const c = createSeededRandom(43);
    const seqA = draw(100, a.next);
    expect(draw(100, b.next)).toEqual(seqA);
    expect(draw(100, c.next)).not.toEqual(seqA);
  });

  it('When drawing uniforms, then they lie in [0, 1) with mean 1/2 and variance 1/12', () => {
    // computed from the definition of the uniform distribution on [0, 1) [C]
    const values = draw(100_000, createSeededRandom(7).next);
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...values)).toBeLessThan(1);
    const { mean, sd } = meanAndSd(values);
    expect(mean).toBeCloseTo(0.5, 2);
    expect(sd * sd).toBeCloseTo(1 / 12, 3);
  });

  it('When drawing normals, then mean 0, standard deviation 1, and 95.45 % within ±2σ', () => {
    // computed from the standard normal distribution: P(|Z| < 2) = 0.9545 [C]
    const values = draw(100_000, createSeededRandom(11).normal);
    const { mean, sd } = meanAndSd(values);
    expect(Math.abs(mean)).toBeLessThan(0.02);
    expect(Math.abs(sd - 1)).toBeLessThan(0.02);
    const within = values.filter((v) => Math.abs(v) < 2).length / values.length;
    expect(Math.abs(within - 0.9545)).toBeLessThan(0.005);
  });

  it('When the seed is not finite, then it throws naming seed', () => {
    expect(() => createSeededRandom(Number.NaN)).toThrow('seed');
  });
});

describe('createWander', () => {
  it('When run long, then its spread is sigma and its steps stay small', () => {
    // computed from the stationary Ornstein–Uhlenbeck process: variance σ², step ≈ σ·√(2·dt/τ) [C]
    const wander = createWander(createSeededRandom(3), 1, 4);
    const values = draw(200_000, () => wander.step(0.02));
    expect(Math.abs(meanAndSd(values).sd - 4)).toBeLessThan(0.3);
    const steps = values.slice(1).map((v, i) => Math.abs(v - (values[i] as number)));
    expect(meanAndSd(steps).mean).toBeLessThan(4 * Math.sqrt(2 * 0.02) * 1.2);
  });
});
