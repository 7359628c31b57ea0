import { divide, type Unit, unit } from 'mathjs';
import { dutyLevel, FUEL_DENSITY_GCC, fuelPerEventMg, injectorDutyPct } from './injector-duty';

describe('injectorDutyPct', () => {
  it('When 33.78 mg per event at 3000 rpm on 440 cc/min gasoline, then it matches mathjs units', () => {
    // Source: mathjs 15.2.0 unit arithmetic (pulse = fuel / flow, cycle = 2 rev / N) [C]
    const flow = unit(440, 'cm^3/minute').multiply(unit(0.745, 'g/cm^3'));
    const pulseMs = (unit(33.78, 'mg').divide(flow) as Unit).toNumber('ms');
    const cycleMs = (divide(unit(2, 'minute'), 3000) as Unit).toNumber('ms');
    expect(injectorDutyPct(33.78, 3000, 440, 0.745)).toBeCloseTo((pulseMs / cycleMs) * 100, 9);
  });

  it('When the fuel density is left out, then gasoline 0.745 g/cc is used', () => {
    // common practice, no published source (gasoline ~0.745 g/cc)
    expect(FUEL_DENSITY_GCC.gasoline).toBe(0.745);
    expect(injectorDutyPct(20, 5000, 550)).toBe(injectorDutyPct(20, 5000, 550, 0.745));
  });

  it('When the engine is stopped, then the duty is 0', () => {
    // computed from the formulas: an infinite cycle time leaves no duty [C]
    expect(injectorDutyPct(10, 0, 440)).toBe(0);
  });

  it.each([
    [-1, 3000, 440, 'fuelMgPerEvent'],
    [10, -5, 440, 'rpm'],
    [10, 3000, 0, 'injectorCcMin'],
  ])('When given %p mg, %p rpm, %p cc/min, then it throws naming %s', (mg, rpm, cc, name) => {
    expect(() => injectorDutyPct(mg, rpm, cc)).toThrow(name);
  });
});

describe('fuelPerEventMg', () => {
  it('When λ 0.85 on E85, then the fuel is air / (0.85 · 9.81)', () => {
    // Source: computed from the definition λ = (A/F)/(A/F)_st (reference.md §2) [C]
    expect(fuelPerEventMg(400, 0.85, 9.81)).toBeCloseTo(400 / (0.85 * 9.81), 12);
  });

  it('When lambda is 0, then it throws naming lambdaCmd', () => {
    expect(() => fuelPerEventMg(400, 0, 14.7)).toThrow('lambdaCmd');
  });
});

describe('dutyLevel', () => {
  // common practice, no published source (warn at 85 %, critical at 95 %)
  it.each([
    [50, 'ok'],
    [84.99, 'ok'],
    [85, 'warn'],
    [94.9, 'warn'],
    [95, 'critical'],
    [120, 'critical'],
  ])('When the duty is %p %%, then the level is %s', (duty, level) => {
    expect(dutyLevel(duty)).toBe(level);
  });

  it('When the thresholds are custom, then they are used', () => {
    expect(dutyLevel(80, { warnPct: 75, criticalPct: 90 })).toBe('warn');
  });

  it('When warn is not below critical, then it throws', () => {
    expect(() => dutyLevel(80, { warnPct: 95, criticalPct: 90 })).toThrow('warnPct');
  });
});
