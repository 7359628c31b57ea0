import fc from 'fast-check';
import { createGrid } from '../../shared/core/table';
import { type GearingSpec } from '../../shared/physics';
import { cautionsFor, planSession, type PlanInput } from '../../shared/plan';

const rpmAxis = [800, 1200, 1600, 2000, 2500, 3000, 3500, 4000, 4500, 5000, 5500, 6000, 6500];
const mapAxisKpa = [30, 40, 50, 60, 70, 80, 90, 100, 115, 130, 150, 170];
// 205/55R16 with D = 631.9 mm (reference.md §9 worked example)
const gearing: GearingSpec = {
  tireDiameterMm: 631.9,
  gearRatios: [3.42, 1.95, 1.3, 1.03, 0.79],
  finalDrive: 3.9,
};

function input(visitedRows: number): PlanInput {
  const weight = createGrid(mapAxisKpa.length, rpmAxis.length);
  for (let r = 0; r < visitedRows; r++) {
    for (let c = 0; c < rpmAxis.length; c++) weight.data[r * rpmAxis.length + c] = 30;
  }
  return { rpmAxis, mapAxisKpa, weight, gearing };
}

describe('road targets against the published road-speed formula', () => {
  it('When a road plan is made, then each speed is 0.06·N·π·D/(i_gear·i_final) within 0.05 km/h', () => {
    // Source: Engineers Edge "Vehicle Speed" page, v = 0.06·N·π·D/(i_gear·i_final) [S]; the
    // formula written out here independently of shared/physics [C]
    const plan = planSession(input(4), { kind: 'road', speedLimitKph: 130, maxTargets: 60 });
    expect(plan.targets.length).toBeGreaterThan(10);
    for (const t of plan.targets) {
      const ratio = gearing.gearRatios[t.gear! - 1]!;
      const expected = (0.06 * t.rpm * Math.PI * 0.6319) / (ratio * gearing.finalDrive);
      expect(Math.abs(t.speedKph! - expected)).toBeLessThanOrEqual(0.05);
    }
  });

  it('When 2587 rpm is a breakpoint, then top gear 0.79 reaches it at 100 km/h', () => {
    // Source: reference.md §9 worked example, 205/55R16, 0.79, 3.9: 100 km/h = 2587 rpm [C]
    const plan = planSession(
      { ...input(3), rpmAxis: [...rpmAxis.slice(0, 4), 2587, ...rpmAxis.slice(5)] },
      { kind: 'road', speedLimitKph: 100.05, typicalSpeedKph: 100, maxTargets: 80 },
    );
    const at2587 = plan.targets.filter((t) => t.rpm === 2587);
    expect(at2587.length).toBeGreaterThan(0);
    for (const t of at2587) {
      expect(t.gear).toBe(5);
      expect(t.speedKph).toBeCloseTo(100, 1);
    }
  });

  it('When any speed limit and gearing are given, then no target exceeds the limit', () => {
    // common practice, no published source: a road plan never asks for more than the limit
    fc.assert(
      fc.property(
        fc.double({ min: 20, max: 160, noNaN: true }),
        fc.double({ min: 2.8, max: 4.6, noNaN: true }),
        fc.integer({ min: 1, max: 8 }),
        (limit, finalDrive, visitedRows) => {
          const plan = planSession(
            { ...input(visitedRows), gearing: { ...gearing, finalDrive } },
            { kind: 'road', speedLimitKph: limit, maxTargets: 200, includeUnreachable: true },
          );
          return plan.targets.every((t) => t.speedKph === null || t.speedKph <= limit);
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('hold times against common practice', () => {
  it('When a dyno plan is made, then settle and hold are 2–5 s and boosted holds ≤ 10 s', () => {
    // common practice, no published source (reference.md §9: settle 2–5 s, average 2–5 s,
    // boosted holds ≤ 5–10 s)
    const plan = planSession(input(10), { kind: 'dyno', maxTargets: 100 });
    const holds = plan.targets.filter((t) => t.kind === 'hold');
    expect(holds.some((t) => t.mapKpa > 101.3)).toBe(true);
    for (const t of holds) {
      expect(t.settleS).toBeGreaterThanOrEqual(2);
      expect(t.settleS).toBeLessThanOrEqual(5);
      expect(t.holdS).toBeGreaterThanOrEqual(2);
      expect(t.holdS).toBeLessThanOrEqual(5);
      if (t.mapKpa > 101.3) expect(t.settleS + t.holdS).toBeLessThanOrEqual(10);
    }
  });
});

describe('dyno cautions against the regulations they cite', () => {
  it('When shown, then hearing protection cites 29 CFR 1910.95 and its 85 dBA action level', () => {
    // Source: OSHA 29 CFR 1910.95 — 85 dBA 8-hour TWA triggers hearing conservation [S]
    const text = cautionsFor('dyno').join('\n');
    expect(text).toContain('29 CFR 1910.95');
    expect(text).toContain('85 dBA');
  });

  it('When shown, then exhaust extraction cites 29 CFR 1910.1000 and the CO PEL of 50 ppm', () => {
    // Source: OSHA 29 CFR 1910.1000 Table Z-1, carbon monoxide PEL 50 ppm [S]
    const text = cautionsFor('dyno').join('\n');
    expect(text).toContain('29 CFR 1910.1000');
    expect(text).toContain('50 ppm');
  });
});
