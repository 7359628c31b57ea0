import { DEMO_HATCH, DEMO_ROADSTER } from './demo-vehicles';
import {
  engineTorqueNm,
  manifoldShare,
  steadyBoostKpa,
  steadyMapWithBoostKpa,
  throttleForMap,
} from './engine-model';

describe('air path', () => {
  it.each([
    [1500, 45],
    [3000, 90],
    [4000, 160],
    [5500, 185],
  ])(
    'When asked for the throttle that holds %p rpm at %p kPa, then that throttle holds it',
    (rpm, map) => {
      const tps = throttleForMap(map, rpm, 101.3, DEMO_HATCH);
      expect(steadyMapWithBoostKpa(tps, rpm, 101.3, DEMO_HATCH)).toBeCloseTo(map, 6);
    },
  );

  it('When the target is out of reach, then the throttle is wide open', () => {
    expect(throttleForMap(180, 1500, 101.3, DEMO_HATCH)).toBe(100);
  });

  it('When idling, then the manifold holds 25–45 kPa', () => {
    // common practice, no published source (warm idle vacuum of a small petrol engine)
    const map = steadyMapWithBoostKpa(0, DEMO_HATCH.idleRpm, 101.3, DEMO_HATCH);
    expect(map).toBeGreaterThan(25);
    expect(map).toBeLessThan(45);
  });

  it('When the throttle opens further, then the manifold share rises', () => {
    for (let tps = 0; tps < 100; tps += 5) {
      expect(manifoldShare(tps + 5, 3000)).toBeGreaterThan(manifoldShare(tps, 3000));
    }
  });

  it('When below the boost onset or naturally aspirated, then there is no boost', () => {
    expect(steadyBoostKpa(100, 1500, DEMO_HATCH)).toBe(0);
    expect(steadyBoostKpa(100, 5000, DEMO_ROADSTER)).toBe(0);
    expect(steadyBoostKpa(100, 5000, DEMO_HATCH)).toBeCloseTo(DEMO_HATCH.maxBoostKpa, 9);
  });
});

describe('engineTorqueNm', () => {
  it('When an NA engine is at full load near its peak, then BMEP is 0.9–1.3 MPa', () => {
    // common practice, no published source (modern NA four-valve petrol engines)
    const torque = engineTorqueNm(4500, 100, 25, 101.3, false, DEMO_ROADSTER);
    const bmepKpa = (torque * 4 * Math.PI) / (DEMO_ROADSTER.engine.displacementL / 1000) / 1000;
    expect(bmepKpa).toBeGreaterThan(900);
    expect(bmepKpa).toBeLessThan(1300);
  });

  it('When fuel is cut, then the engine drags (negative torque)', () => {
    expect(engineTorqueNm(3000, 20, 25, 101.3, true, DEMO_HATCH)).toBeLessThan(0);
  });
});
