import type { Vehicle } from '@shared/contracts/vehicles';
import { engineSummary, fuelSummary, gearingSummary } from './vehicle-summary';

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
} as Vehicle;

describe('vehicle summaries', () => {
  it.each([
    [engineSummary, '1.6 L · 4 cylinders · 440 cc/min injectors'],
    [fuelSummary, 'Gasoline (AFR 14.7)'],
    [gearingSummary, '6 gears · final drive 4.06 · tyre 632 mm'],
  ])('%p says it in one line', (summary, expected) => {
    expect(summary(vehicle)).toBe(expected);
  });
});
