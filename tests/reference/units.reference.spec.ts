import { KPA_PER_PSI, STOICH_AFR, stoichiometricAfr, toCelsius, toKpa } from '../../shared/units';

describe('pressure', () => {
  it('1 psi = 6.894757293 kPa', () => {
    // Source: NIST SP 811 App. B.8, 6.894757E+03 Pa (from memory of NIST SP 811) [S*];
    // 4.4482216152605 N / (0.0254 m)² computed from the formulas (reference.md §4) [C]
    expect(KPA_PER_PSI).toBeCloseTo(6.894757293, 9);
  });

  it('10 psig with a standard barometer is 170.273 kPa absolute', () => {
    // Source: computed from the formulas (reference.md §4), baro 101.325 kPa (USSA-1976) [C]
    expect(toKpa(10, 'psi') + 101.325).toBeCloseTo(170.273, 3);
  });
});

describe('temperature', () => {
  it('−40 °C = −40 °F and 77 °F = 25 °C', () => {
    // Source: the definition °F = 1.8 °C + 32 (reference.md §4) [C]
    expect(toCelsius(-40, 'F')).toBeCloseTo(-40, 12);
    expect(toCelsius(77, 'F')).toBeCloseTo(25, 12);
  });
});

describe('stoichiometric air-fuel ratios', () => {
  it('gasoline CH1.87 is 14.60', () => {
    // Source: from memory of Heywood, Internal Combustion Engine Fundamentals, 1st ed. 1988,
    // App. D Table D.4 (14.6) [S*]; formula 34.56(4+y−2z)/(12.011+1.008y+16z) [C]
    expect(stoichiometricAfr(1.87, 0)).toBeCloseTo(14.6, 2);
  });

  it('ethanol is 9.00 and methanol 6.47', () => {
    // Source: from memory of Heywood, ICE Fundamentals 1st ed., App. D (9.00, 6.47) [S*]
    expect(STOICH_AFR.ethanol).toBeCloseTo(9.0, 2);
    expect(STOICH_AFR.methanol).toBeCloseTo(6.47, 2);
  });

  it('E10 is 14.10 and E85 9.81 as mass-weighted blends', () => {
    // Source: computed from the formulas (reference.md §3), ethanol mass fractions 0.105 and
    // 0.857 [C]; trade values 14.1 and 9.7–9.8 are common practice, no published source
    expect(STOICH_AFR.e10).toBeCloseTo(14.1, 2);
    // The formula's ethanol (9.002) and gasoline at 14.7 put E85 at 9.817: within 0.01 of 9.81.
    expect(Math.abs(STOICH_AFR.e85 - 9.81)).toBeLessThan(0.01);
  });

  it('gasoline uses the trade value 14.7', () => {
    // common practice, no published source (Bosch Automotive Handbook 14.7 from memory [S*])
    expect(STOICH_AFR.gasoline).toBe(14.7);
  });
});
