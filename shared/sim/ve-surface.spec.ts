import { DEMO_HATCH, DEMO_ROADSTER, DEMO_VEHICLES, DEMO_WAGON } from './demo-vehicles';
import {
  ecuErrorFraction,
  ecuVeTable,
  lambdaTargetAt,
  lookupBilinear,
  trueVeFraction,
  trueVeTable,
} from './ve-surface';

describe('true VE surfaces of the demo vehicles', () => {
  it.each(DEMO_VEHICLES.map((v) => [v.label, v] as const))(
    'When %s idles (idle rpm, 30–40 kPa), then VE lies in 40–70 %%',
    (_label, vehicle) => {
      // common practice, no published source (reference.md §1 typical VE: idle 40–70 %)
      for (const map of [30, 35, 40]) {
        const ve = trueVeFraction(vehicle.idleRpm, map, vehicle.veShape);
        expect(ve).toBeGreaterThanOrEqual(0.4);
        expect(ve).toBeLessThanOrEqual(0.7);
      }
    },
  );

  it.each(DEMO_VEHICLES.map((v) => [v.label, v] as const))(
    'When %s is at full load, then VE peaks at 90–100 %% in mid-range and falls at the top',
    (_label, vehicle) => {
      // common practice, no published source (reference.md §1: NA WOT 80–100 %, boosted
      // 80–105 % relative to MAP); shape from memory of Heywood Ch. 6 Fig. 6-2 [S*]
      const rpms = Array.from({ length: 61 }, (_, i) => 1000 + i * 100);
      const curve = rpms.map((rpm) => trueVeFraction(rpm, 100, vehicle.veShape));
      const peak = Math.max(...curve);
      const peakRpm = rpms[curve.indexOf(peak)] as number;
      expect(peak).toBeGreaterThanOrEqual(0.9);
      expect(peak).toBeLessThanOrEqual(1.0);
      expect(peakRpm).toBeGreaterThan(2500);
      expect(peakRpm).toBeLessThan(5500);
      expect(trueVeFraction(7000, 100, vehicle.veShape)).toBeLessThan(peak - 0.05);
      expect(trueVeFraction(1000, 100, vehicle.veShape)).toBeLessThan(peak - 0.05);
    },
  );

  it('When compared across loads, then the speed shape changes: not a product of 1-D curves', () => {
    // A product f(rpm)·g(map) keeps ve(r1, m)/ve(r2, m) the same at every m.
    const shape = DEMO_HATCH.veShape;
    const ratioAt = (map: number) =>
      trueVeFraction(1500, map, shape) / trueVeFraction(4500, map, shape);
    expect(Math.abs(ratioAt(40) / ratioAt(100) - 1)).toBeGreaterThan(0.05);
  });

  it('When tabulated, then the table has the vehicle axes and values in percent', () => {
    const table = trueVeTable(DEMO_ROADSTER);
    expect(table.rpmAxis).toEqual(DEMO_ROADSTER.axes.rpmAxis);
    expect(table.mapAxisKpa).toEqual(DEMO_ROADSTER.axes.mapAxisKpa);
    expect(table.values[3]![5]).toBeCloseTo(
      100 * trueVeFraction(2000, 35, DEMO_ROADSTER.veShape),
      12,
    );
  });
});

describe('the ECU table is wrong by several percent', () => {
  it.each(DEMO_VEHICLES.map((v) => [v.label, v] as const))(
    'When %s is compared with its truth, then errors reach 4–15 %% and change sign',
    (_label, vehicle) => {
      const truth = trueVeTable(vehicle);
      const ecu = ecuVeTable(vehicle);
      const errors = ecu.values.flatMap((row, r) =>
        row.map((v, c) => v / truth.values[r]![c]! - 1),
      );
      expect(Math.max(...errors.map(Math.abs))).toBeGreaterThan(0.04);
      expect(Math.max(...errors.map(Math.abs))).toBeLessThan(0.15);
      expect(errors.some((e) => e > 0.01)).toBe(true);
      expect(errors.some((e) => e < -0.01)).toBe(true);
    },
  );

  it('When at the bump, then the table is locally lower than around it', () => {
    const f = DEMO_WAGON.ecuError;
    const atBump = ecuErrorFraction(f.bumpRpm, f.bumpMapKpa, f);
    const beside = ecuErrorFraction(f.bumpRpm + 2000, f.bumpMapKpa, f);
    expect(atBump).toBeLessThan(beside - 0.03);
  });

  it('When stored, then the ECU values are rounded to 0.1', () => {
    for (const v of ecuVeTable(DEMO_HATCH).values.flat())
      expect(Math.round(v * 10)).toBeCloseTo(v * 10, 9);
  });
});

describe('lookupBilinear', () => {
  const table = {
    rpmAxis: [20, 21],
    mapAxisKpa: [14, 15],
    values: [
      [91, 162],
      [210, 95],
    ],
  };

  it('When at (20.2, 14.5), then 146.1 as in the published example', () => {
    // Source: Wikipedia "Bilinear interpolation", Example: f(20.2, 14.5) = 146.1 [S]
    expect(lookupBilinear(table, 20.2, 14.5)).toBeCloseTo(146.1, 9);
    expect(lookupBilinear(table, 20, 14.5)).toBeCloseTo(150.5, 9);
    expect(lookupBilinear(table, 21, 14.5)).toBeCloseTo(128.5, 9);
  });

  it('When outside the axes, then it clamps to the edge (no extrapolation)', () => {
    // Source: MathWorks MAAB/JMAAB guideline jc_0626, "Extrapolation Method: Clip" [S]
    expect(lookupBilinear(table, 10, 14)).toBe(91);
    expect(lookupBilinear(table, 30, 20)).toBe(95);
  });
});

describe('lambdaTargetAt', () => {
  it('When at part load, then stoichiometric; when at full load, the full-load lambda', () => {
    // common practice, no published source (reference.md §7: WOT λ 0.75–0.82 boosted, 0.85–0.90 NA)
    expect(lambdaTargetAt(2500, 60, DEMO_HATCH)).toBe(1);
    expect(lambdaTargetAt(3500, 180, DEMO_HATCH)).toBeCloseTo(0.8, 3);
    expect(lambdaTargetAt(3500, 100, DEMO_ROADSTER)).toBeCloseTo(0.87, 3);
  });
});
