import { roadSpeedKph, rpmAtSpeed, tyreDiameterMm } from './road-speed';

describe('road speed argument checks', () => {
  it.each([
    [() => roadSpeedKph(-1, 0.6, 1, 3.9), 'rpm'],
    [() => roadSpeedKph(3000, 0, 1, 3.9), 'tyreDiameterM'],
    [() => roadSpeedKph(3000, 0.6, 0, 3.9), 'gearRatio'],
    [() => rpmAtSpeed(50, 0.6, 1, -3.9), 'finalDrive'],
    [() => rpmAtSpeed(Number.NaN, 0.6, 1, 3.9), 'speedKph'],
    [() => tyreDiameterMm(205, 0, 16), 'aspectPct'],
  ])('When an argument is invalid (%#), then the error names %s', (call, name) => {
    expect(call).toThrow(name);
  });
});

describe('road speed proportions', () => {
  it('When the gear ratio halves, then the speed doubles', () => {
    // computed from the formulas: v ∝ 1/i_gear (reference.md §9) [C]
    expect(roadSpeedKph(3000, 0.63, 0.8, 4)).toBeCloseTo(2 * roadSpeedKph(3000, 0.63, 1.6, 4), 10);
  });

  it('When a 215/45R17 tyre, then the diameter is 625.3 mm', () => {
    // computed from the formula D = 2·w·AR/100 + rim·25.4 (reference.md §9) [C]
    expect(tyreDiameterMm(215, 45, 17)).toBeCloseTo(625.3, 9);
  });
});
