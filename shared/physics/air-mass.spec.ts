import { airDensity, airMassFlowGps, airMassPerEventMg, intakeEventsPerSecond } from './air-mass';

describe('air mass argument checks', () => {
  it.each([
    [() => airDensity(0, 25), 'pressureKpa'],
    [() => airDensity(100, -300), 'temperatureC'],
    [() => airMassFlowGps(0, 100, 25, 2, 3000), 'veFraction'],
    [() => airMassFlowGps(0.8, 100, 25, -2, 3000), 'displacementL'],
    [() => airMassFlowGps(0.8, 100, 25, 2, -1), 'rpm'],
    [() => airMassPerEventMg(0.8, 100, 25, 2, 2.5), 'cylinders'],
    [() => airMassFlowGps(0.8, Number.NaN, 25, 2, 3000), 'pressureKpa'],
  ])('When an argument is invalid (%#), then the error names %s', (call, name) => {
    expect(call).toThrow(name);
  });
});

describe('air mass scaling', () => {
  it('When MAP doubles at the same temperature, then the air doubles', () => {
    // computed from the formulas: ṁ ∝ MAP (reference.md §1) [C]
    const low = airMassFlowGps(0.9, 90, 30, 1.6, 4000);
    expect(airMassFlowGps(0.9, 180, 30, 1.6, 4000)).toBeCloseTo(2 * low, 10);
  });

  it('When the engine is stopped, then the flow is 0', () => {
    expect(airMassFlowGps(0.9, 100, 25, 2, 0)).toBe(0);
  });

  it('When a six-cylinder turns 6000 rpm, then 300 intake events happen per second', () => {
    // computed from the formulas: n_cyl·N/120 (reference.md §1) [C]
    expect(intakeEventsPerSecond(6, 6000)).toBe(300);
  });

  it('When the cylinder count halves, then the air per event doubles', () => {
    // computed from the formulas: m_cyl = VE·ρ·V_d/n_cyl (reference.md §1) [C]
    expect(airMassPerEventMg(0.8, 100, 25, 2, 2)).toBeCloseTo(
      2 * airMassPerEventMg(0.8, 100, 25, 2, 4),
      10,
    );
  });
});
