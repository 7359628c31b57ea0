import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { savitzkyGolayCoefficients } from '../../shared/filter';

interface CoefficientFixture {
  scipy: string;
  cases: {
    windowLength: number;
    polyOrder: number;
    derivative: number;
    delta: number;
    position: number;
    coefficients: number[];
  }[];
}

const fixture = JSON.parse(
  readFileSync(join(__dirname, '../fixtures/savgol/coefficients.json'), 'utf8'),
) as CoefficientFixture;

describe('Savitzky–Golay smoothing weights (published table)', () => {
  it('5-point quadratic is (−3, 12, 17, 12, −3)/35', () => {
    // Source: from memory of Savitzky & Golay, Anal. Chem. 36(8):1627, 1964, Table I [S*]
    const expected = [-3, 12, 17, 12, -3].map((v) => v / 35);
    const c = savitzkyGolayCoefficients(5, 2);
    expected.forEach((v, j) => expect(c[j]).toBeCloseTo(v, 14));
  });

  it('7-point quadratic is (−2, 3, 6, 7, 6, 3, −2)/21', () => {
    // Source: from memory of Savitzky & Golay, Anal. Chem. 36(8):1627, 1964, Table I [S*]
    const expected = [-2, 3, 6, 7, 6, 3, -2].map((v) => v / 21);
    const c = savitzkyGolayCoefficients(7, 2);
    expected.forEach((v, j) => expect(c[j]).toBeCloseTo(v, 14));
  });

  it('a cubic fit gives the same centre weights as the quadratic (odd terms vanish)', () => {
    // Source: from memory of Savitzky & Golay 1964 (one table serves orders 2 and 3) [S*]
    const quadratic = savitzkyGolayCoefficients(7, 2);
    const cubic = savitzkyGolayCoefficients(7, 3);
    quadratic.forEach((v, j) => expect(cubic[j]).toBeCloseTo(v, 13));
  });
});

describe('Savitzky–Golay weights against scipy.signal.savgol_coeffs', () => {
  it.each(
    fixture.cases.map((c) => [c.windowLength, c.polyOrder, c.derivative, c.position, c] as const),
  )(
    'window %i, order %i, derivative %i, position %i',
    (windowLength, polyOrder, derivative, position, c) => {
      // Source: scipy.signal.savgol_coeffs(use='dot') golden fixture from
      // tests/fixtures/savgol/generate.py (Debian python3-scipy) [C]
      const ours = savitzkyGolayCoefficients(windowLength, polyOrder, {
        derivative,
        delta: c.delta,
        position,
      });
      const scale = Math.max(...c.coefficients.map(Math.abs));
      expect(ours).toHaveLength(c.coefficients.length);
      c.coefficients.forEach((v, j) => expect(Math.abs(ours[j] - v)).toBeLessThan(1e-9 * scale));
    },
  );
});
