import { z } from 'zod';
import { DEFAULT_FUEL_SAFETY, type Vehicle, fuelSafetySchema } from '@shared/contracts/vehicles';
import { STOICH_AFR } from '@shared/units';
import {
  DEFAULT_FUEL_SAFETY_VALUES,
  type VehicleFormValue,
  VEHICLE_LIMITS,
  limitError,
  parseGearRatios,
  rangeMessage,
  stoichAfrFor,
  tyreDiameterMm,
  vehicleFormValue,
  vehicleRequest,
} from './vehicle-form';

describe('parseGearRatios', () => {
  it.each([
    ['3.36, 2.09, 1.47, 1.1, 0.87', [3.36, 2.09, 1.47, 1.1, 0.87]],
    ['3.5,2', [3.5, 2]],
    [' 3.5 ; 2 ; 1 ', [3.5, 2, 1]],
    ['3.5 2 1', [3.5, 2, 1]],
    ['1', [1]],
    ['0.2, 10', [0.2, 10]],
  ])('When %p is typed, then the ratios are %p', (text, ratios) => {
    expect(parseGearRatios(text)).toEqual({ ratios, error: null });
  });

  it.each([
    ['', 'Enter at least one gear ratio.'],
    ['   ', 'Enter at least one gear ratio.'],
    ['3.5, abc', 'Gear 2: “abc” is not a number.'],
    ['3.5,,2', 'Gear 2: “” is not a number.'],
    ['3.5, 0.1', 'Gear 2: 0.1 is outside 0.2–10.'],
    ['12, 3', 'Gear 1: 12 is outside 0.2–10.'],
    [Array(13).fill('1').join(','), 'At most 12 gears (13 given).'],
  ])('When %p is typed, then it is refused with %p', (text, error) => {
    expect(parseGearRatios(text)).toEqual({ ratios: null, error });
  });
});

describe('tyreDiameterMm', () => {
  it.each([
    // 16 in = 406.4 mm rim + 2 × 55 % × 205 mm sidewalls = 631.9 mm [C]
    [205, 55, 16, 631.9],
    // 17 in = 431.8 mm + 2 × 45 % × 225 mm = 634.3 mm [C]
    [225, 45, 17, 634.3],
    [195, 65, 15, 634.5],
    [0, 55, 16, null],
    [205, -1, 16, null],
    [205, 55, Number.NaN, null],
  ])('When the size is %p/%p R%p, then the diameter is %p mm', (width, aspect, rim, expected) => {
    expect(tyreDiameterMm(width, aspect, rim)).toBe(expected);
  });
});

describe('stoichAfrFor', () => {
  it.each([
    ['gasoline', 14.7],
    ['e85', Math.round(STOICH_AFR.e85 * 100) / 100],
    ['methanol', Math.round(STOICH_AFR.methanol * 100) / 100],
    ['custom', null],
  ] as const)('When the fuel is %p, then the prefilled AFR is %p', (fuel, expected) => {
    expect(stoichAfrFor(fuel)).toBe(expected);
  });
});

describe('rangeMessage', () => {
  it.each([
    [VEHICLE_LIMITS.displacementL, 'Displacement must be 0.05–20 L.'],
    [VEHICLE_LIMITS.cylinders, 'Cylinders must be 1–16.'],
    [VEHICLE_LIMITS.injectorCcMin, 'Injector flow must be 10–10000 cc/min.'],
    [VEHICLE_LIMITS.tireDiameterMm, 'Tyre diameter must be 200–1500 mm.'],
    [VEHICLE_LIMITS.loadLinePercentOfBaro, 'Load line must be 50–150 %.'],
    [VEHICLE_LIMITS.leanAllowancePercent, 'Lean allowance must be 0–5 %.'],
  ])('When a value is out of %p, then the message says %p', (limit, message) => {
    expect(rangeMessage(limit)).toBe(message);
  });
});

describe('limitError', () => {
  it.each([
    [null, null],
    [{ required: true }, 'Enter the displacement in L.'],
    [{ min: { min: 0.05, actual: 0 } }, 'Displacement must be 0.05–20 L.'],
    [{ max: { max: 20, actual: 30 } }, 'Displacement must be 0.05–20 L.'],
    [{ whole: true }, 'Displacement must be a whole number.'],
  ])('When the errors are %p, then the message is %p', (errors, message) => {
    expect(limitError(errors, VEHICLE_LIMITS.displacementL)).toBe(message);
  });
});

describe('vehicleRequest and vehicleFormValue', () => {
  const form: VehicleFormValue = {
    label: '  Test hatch ',
    description: ' bigger turbo ',
    displacementL: 1.6,
    cylinders: 4,
    fuel: 'e85',
    stoichAfr: stoichAfrFor('e85') ?? 0,
    injectorCcMin: 1000,
    tireDiameterMm: 631.9,
    gearRatios: '3.4, 1.9, 1.3',
    finalDrive: 4.06,
    loadLinePercentOfBaro: 92,
    leanAllowancePercent: 0.5,
  };

  it.each([
    ['the prefilled AFR of a known fuel', {}, undefined],
    ['a changed AFR', { stoichAfr: 9.9 }, 9.9],
    ['a custom fuel', { fuel: 'custom', stoichAfr: 12.5 }, 12.5],
  ] as const)('When the form holds %s, then stoichAfr is sent as %p', (_name, change, afr) => {
    expect(vehicleRequest({ ...form, ...change }).engine.stoichAfr).toBe(afr);
  });

  it('When the form is valid, then the body is trimmed and the ratios parsed', () => {
    const body = vehicleRequest(form);
    expect(body.label).toBe('Test hatch');
    expect(body.description).toBe('bigger turbo');
    expect(body.gearing).toEqual({
      tireDiameterMm: 631.9,
      gearRatios: [3.4, 1.9, 1.3],
      finalDrive: 4.06,
    });
    expect(body.fuelSafety).toEqual({ loadLinePercentOfBaro: 92, leanAllowancePercent: 0.5 });
  });

  it.each([
    ['its own fuel value', STOICH_AFR.e85, stoichAfrFor('e85')],
    ['another value', 9.123, 9.123],
  ])('When a vehicle has %s as AFR, then the form shows %p', (_name, stoichAfr, shown) => {
    const vehicle = {
      id: 'v1',
      label: 'Test hatch',
      description: '',
      engine: { displacementL: 1.6, cylinders: 4, fuel: 'e85', stoichAfr, injectorCcMin: 1000 },
      gearing: { tireDiameterMm: 631.9, gearRatios: [3.4, 1.9], finalDrive: 4.06 },
      fuelSafety: { loadLinePercentOfBaro: 105, leanAllowancePercent: 0 },
      createdAt: '2026-01-01T00:00:00.000Z',
      updatedAt: '2026-01-01T00:00:00.000Z',
    } satisfies Vehicle;
    const value = vehicleFormValue(vehicle);
    expect(value.stoichAfr).toBe(shown);
    expect(value.gearRatios).toBe('3.4, 1.9');
    expect(value).toMatchObject({ loadLinePercentOfBaro: 105, leanAllowancePercent: 0 });
  });
});

/** The client keeps its own copy of the fuel-safety ranges and defaults (no zod in the bundle). */
describe('fuel-safety limits against the contract', () => {
  const schema = z.toJSONSchema(fuelSafetySchema) as {
    properties: Record<string, { minimum: number; maximum: number }>;
  };

  it.each(['loadLinePercentOfBaro', 'leanAllowancePercent'] as const)(
    'When %s is checked, then its range is the schema’s',
    (field) => {
      const { min, max } = VEHICLE_LIMITS[field];
      expect({ min, max }).toEqual({
        min: schema.properties[field]?.minimum,
        max: schema.properties[field]?.maximum,
      });
    },
  );

  it('When a vehicle is new, then the form starts at the contract’s defaults', () => {
    expect(DEFAULT_FUEL_SAFETY_VALUES).toEqual(DEFAULT_FUEL_SAFETY);
  });
});
