import { airMassPerEventMg } from '../physics/air-mass';
import { fuelPerEventMg } from '../physics/injector-duty';
import { DEMO_HATCH } from './demo-vehicles';
import { createSimEcu, type EcuInput } from './ecu-model';
import { createSeededRandom } from './seeded-random';
import { ecuVeTable, lambdaTargetTable, lookupBilinear } from './ve-surface';

const warm: EcuInput = {
  dtS: 0.05,
  rpm: 4000,
  mapKpa: 150,
  iatC: 30,
  ectC: 90,
  tpsPct: 70,
  lambdaMeasured: 0.8,
};

function ecu() {
  return createSimEcu(
    DEMO_HATCH,
    ecuVeTable(DEMO_HATCH),
    lambdaTargetTable(DEMO_HATCH),
    createSeededRandom(1),
  );
}

describe('createSimEcu', () => {
  it('When warm and open loop, then the fuel is the speed-density fuel for its table', () => {
    // computed from the formulas: m_f = VE·ρ·V_d/n_cyl/(AFR_st·λ_cmd) (reference.md §1) [C]
    const out = ecu().step(warm);
    const ve = lookupBilinear(ecuVeTable(DEMO_HATCH), 4000, 150) / 100;
    const air = airMassPerEventMg(ve, 150, 30, 1.6, 4);
    expect(out.isClosedLoop).toBe(false);
    expect(out.fuelMgPerEvent).toBeCloseTo(fuelPerEventMg(air, out.lambdaTarget, 14.7), 9);
  });

  it('When the throttle is snapped open, then tip-in enrichment adds fuel that decays', () => {
    const unit = ecu();
    unit.step({ ...warm, tpsPct: 20 });
    const snap = unit.step({ ...warm, tpsPct: 60 });
    expect(snap.enrichment).toBeGreaterThan(1.1);
    let later = snap;
    for (let i = 0; i < 60; i++) later = unit.step({ ...warm, tpsPct: 60 });
    expect(later.enrichment).toBeLessThan(1.001);
  });

  it('When the throttle closes at high rpm, then fuel is cut only after a short delay', () => {
    const unit = ecu();
    const closed = { ...warm, tpsPct: 0, mapKpa: 20 };
    const flags = Array.from({ length: 20 }, () => unit.step(closed).isFuelCut);
    expect(flags.slice(0, 15).some(Boolean)).toBe(false);
    expect(flags.at(-1)).toBe(true);
    expect(unit.step(closed).fuelMgPerEvent).toBe(0);
  });

  it('When cold, then warm-up enrichment adds fuel and the loop stays open', () => {
    const cold = { ...warm, ectC: 10, mapKpa: 50, tpsPct: 10, lambdaMeasured: 1 };
    const unit = ecu();
    let out = unit.step(cold);
    for (let i = 0; i < 100; i++) out = unit.step(cold);
    expect(out.enrichment).toBeCloseTo(1.25, 9);
    expect(out.isClosedLoop).toBe(false);
  });
});
