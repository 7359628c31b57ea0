import {
  airDensity,
  airMassFlowGps,
  airMassPerEventMg,
  fuelPerEventMg,
  R_AIR,
} from '../../shared/physics';

describe('gas constant of dry air', () => {
  it('When computed from the USSA-1976 constants, then R is 287.053 J/(kg·K)', () => {
    // Source: U.S. Standard Atmosphere 1976 constants R* = 8.31432, M0 = 0.0289644, as quoted by
    // crnslab.org citing USSA-1976 and ICAO Doc 7488 [S]; quotient computed (reference.md §1) [C]
    expect(Math.abs(R_AIR - 287.053) / 287.053).toBeLessThan(1e-4);
  });

  it('When compared with CODATA-2018 (287.055) and Heywood (287), then it is within 1e-4 / 1e-3', () => {
    // Source: reference.md §1 — CODATA-2018 287.055 [S*]; Heywood 287 (from memory of Heywood,
    // Internal Combustion Engine Fundamentals, 1st ed. 1988) [S*]
    expect(Math.abs(R_AIR - 287.055) / 287.055).toBeLessThan(1e-4);
    expect(Math.abs(R_AIR - 287) / 287).toBeLessThan(1e-3);
  });
});

describe('air density', () => {
  it('When at the ISA sea-level standard (101325 Pa, 288.15 K), then ρ is 1.2250 kg/m³', () => {
    // Source: U.S. Standard Atmosphere 1976 / ISA sea-level density 1.2250 kg/m³, read via the
    // scipp.ucsc.edu and crnslab summaries [S]
    expect(airDensity(101.325, 15)).toBeCloseTo(1.225, 4);
  });

  it('When at 100 kPa and 25 °C, then ρ_man is 1.16844 kg/m³', () => {
    // Source: computed from the formulas (reference.md §1 worked example) [C]
    expect(airDensity(100, 25)).toBeCloseTo(1.16844, 4);
  });
});

describe('speed-density worked example: 2.0 L four-cylinder, 3000 rpm, 100 kPa, 25 °C, VE 0.85', () => {
  it('When computing the air mass flow, then it is 49.659 g/s', () => {
    // Source: computed from the formulas (reference.md §1 worked example) [C]
    expect(airMassFlowGps(0.85, 100, 25, 2.0, 3000)).toBeCloseTo(49.659, 2);
  });

  it('When computing the air per intake event, then it is 496.59 mg', () => {
    // Source: computed from the formulas (reference.md §1 worked example) [C]
    expect(airMassPerEventMg(0.85, 100, 25, 2.0, 4)).toBeCloseTo(496.59, 1);
  });

  it('When fuelling that air at λ 1 with AFR_st 14.7, then the fuel is 33.78 mg per event', () => {
    // Source: computed from the formulas (reference.md §1 worked example) [C]
    const airMg = airMassPerEventMg(0.85, 100, 25, 2.0, 4);
    expect(fuelPerEventMg(airMg, 1, 14.7)).toBeCloseTo(33.78, 2);
  });

  it('When the event mass is multiplied by 100 events/s, then it equals the mass flow', () => {
    // Source: computed from the formulas — n_cyl·N/120 events per second (reference.md §1) [C]
    const perEvent = airMassPerEventMg(0.85, 100, 25, 2.0, 4);
    expect((perEvent * 100) / 1000).toBeCloseTo(airMassFlowGps(0.85, 100, 25, 2.0, 3000), 9);
  });
});

describe('published speed-density form', () => {
  // Source: MathWorks Powertrain Blockset, "SI Engine Speed-Density Air Mass Flow Model":
  // ṁ = MAP·V_d·N/(60·C_ps·R_air·MAT)·η_v, C_ps = 2 crank revolutions per power stroke [S]
  function blocksetForm(ve: number, mapPa: number, matK: number, vdM3: number, rpm: number) {
    const cps = 2;
    return ((mapPa * vdM3 * rpm) / (60 * cps * R_AIR * matK)) * ve;
  }

  it.each([
    [0.85, 100, 25, 2.0, 3000],
    [0.45, 32, 40, 1.6, 850],
    [0.97, 210, 55, 2.5, 6200],
  ])(
    'When VE %p, MAP %p kPa, IAT %p °C, %p L, %p rpm, then both forms agree within 1e-12',
    (ve, mapKpa, iatC, litres, rpm) => {
      const published = blocksetForm(ve, mapKpa * 1000, iatC + 273.15, litres / 1000, rpm) * 1000;
      const ours = airMassFlowGps(ve, mapKpa, iatC, litres, rpm);
      expect(Math.abs(ours - published) / published).toBeLessThan(1e-12);
    },
  );
});
