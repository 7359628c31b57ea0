import type { Vehicle } from '@shared/contracts/vehicles';
import { engineSummary, fuelSummary, gearingSummary, topGearSpeedText } from './vehicle-summary';

const vehicle = {
  id: 'v1',
  label: 'Test hatch',
  description: '',
  engine: {
    displacementL: 1.6,
    cylinders: 4,
    fuel: 'gasoline',
    stoichAfr: 14.7,
    injectorCcMin: 440,
  },
  gearing: { tireDiameterMm: 631.9, gearRatios: [3.4, 1.9, 1.3, 1, 0.8, 0.7], finalDrive: 4.06 },
  fuelSafety: { loadLinePercentOfBaro: 90, leanAllowancePercent: 1 },
} as Vehicle;

describe('vehicle summaries', () => {
  it.each([
    [engineSummary, '1.6 L · 4 cylinders · 440 cc/min injectors'],
    [fuelSummary, 'Gasoline (AFR 14.7)'],
    [gearingSummary, '6 gears · final drive 4.06 · tyre 632 mm'],
  ])('%p says it in one line', (summary, expected) => {
    expect(summary(vehicle)).toBe(expected);
  });

  it.each([
    // 1.6 L = 97.64 ci; 440 cc/min × 0.745 g/cc × 60 / 453.59237 g/lb = 43.36 lb/h
    [engineSummary, '97.6 ci · 4 cylinders · 43.4 lb/h injectors'],
    // 631.9 mm / 25.4 = 24.878 in
    [gearingSummary, '6 gears · final drive 4.06 · tyre 24.88 in'],
  ])('%p says it in imperial units', (summary, expected) => {
    expect(summary(vehicle, 'imperial')).toBe(expected);
  });

  it('When the fuel is E85, then the injector flow in lb/h uses its density', () => {
    const e85 = { ...vehicle, engine: { ...vehicle.engine, fuel: 'e85' } } as Vehicle;
    // 440 cc/min × 0.7824 g/cc × 60 / 453.59237 g/lb = 45.54 lb/h
    expect(engineSummary(e85, 'imperial')).toContain('45.5 lb/h');
  });
});

describe('topGearSpeedText', () => {
  it.each([
    // v = 0.06 · 1000 · π · 0.6319 / (0.7 · 4.06) = 41.9 km/h (reference.md §9) = 26.0 mph
    ['metric', '41.9 km/h'],
    ['imperial', '26 mph'],
  ] as const)('When shown in %p, then 1000 rpm in top gear is %p', (units, text) => {
    expect(topGearSpeedText(vehicle, units)).toBe(text);
  });

  it('When a vehicle has no gears, then there is no figure', () => {
    const none = { ...vehicle, gearing: { ...vehicle.gearing, gearRatios: [] } } as Vehicle;
    expect(topGearSpeedText(none)).toBeNull();
  });
});
