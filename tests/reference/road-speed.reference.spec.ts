import { roadSpeedKph, rpmAtSpeed, tyreDiameterMm } from '../../shared/physics';

describe('road speed from engine speed and gearing', () => {
  it('When 4000 rpm, D 0.6 m, gear 1.0, final drive 3.9, then 115.997 km/h', () => {
    // Source: calculatorlib vehicle speed calculator example [S]; computed from the formula
    // v = 0.06·N·π·D/(i_gear·i_final) (reference.md §9, Engineers Edge "Vehicle Speed") [C]
    expect(roadSpeedKph(4000, 0.6, 1.0, 3.9)).toBeCloseTo(115.997, 3);
  });

  it('When 2200 rpm, gear 0.76, final drive 4.10, circumference 2.288 m, then 96.92 km/h', () => {
    // Source: a public forum calculation for a 275/40R20 tyre (reference.md §9) [S]; [C]
    expect(roadSpeedKph(2200, 2.288 / Math.PI, 0.76, 4.1)).toBeCloseTo(96.92, 2);
  });
});

describe('engine speed at a road speed', () => {
  it('When 205/55R16 (D 631.9 mm), gear 0.79, final drive 3.9, then 100 km/h is 2587 rpm', () => {
    // Source: computed from the formulas (reference.md §9) [C]
    const diameterMm = tyreDiameterMm(205, 55, 16);
    expect(diameterMm).toBeCloseTo(631.9, 1);
    expect(Math.round(rpmAtSpeed(100, diameterMm / 1000, 0.79, 3.9))).toBe(2587);
  });

  it('When converting there and back, then the speed returns unchanged', () => {
    // Source: computed from the formulas — rpmAtSpeed is the algebraic inverse (reference.md §9) [C]
    for (const kph of [0, 12.5, 97, 180]) {
      const rpm = rpmAtSpeed(kph, 0.6319, 1.3, 4.06);
      expect(roadSpeedKph(rpm, 0.6319, 1.3, 4.06)).toBeCloseTo(kph, 9);
    }
  });
});
