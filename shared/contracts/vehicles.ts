import { z } from 'zod';
import { idParam } from './id-param';
import { FUELS, STOICH_AFR, type Fuel } from '../units/fuels';

/** A vehicle id in a path (`/vehicles/:id`). */
export const vehicleIdParamSchema = idParam('vehicle');

/** A vehicle id in a path. */
export type VehicleIdParams = z.infer<typeof vehicleIdParamSchema>;

/** A number within `[min, max]` whose every message names the field and its unit. */
function rangeSchema(field: string, min: number, max: number, unit = '') {
  const range = `between ${min} and ${max}${unit ? ` ${unit}` : ''}`;
  return z
    .number({ error: `${field} must be a number` })
    .min(min, `${field} must be ${range}`)
    .max(max, `${field} must be ${range}`);
}

/** The fuel's stoichiometric AFR the product uses, or undefined for `custom`. */
export function defaultStoichAfr(fuel: Fuel): number | undefined {
  return fuel === 'custom' ? undefined : STOICH_AFR[fuel];
}

const engineFields = {
  displacementL: rangeSchema('displacementL', 0.05, 20, 'L'),
  cylinders: rangeSchema('cylinders', 1, 16).int('cylinders must be a whole number'),
  fuel: z.enum(FUELS, { error: `fuel must be one of ${FUELS.join(', ')}` }),
  // Wide on purpose: `custom` covers fuels far from gasoline in either direction.
  stoichAfr: rangeSchema('stoichAfr', 1, 40),
  injectorCcMin: rangeSchema('injectorCcMin', 10, 10000, 'cc/min'),
};

const gearingFields = {
  tireDiameterMm: rangeSchema('tireDiameterMm', 200, 1500, 'mm'),
  gearRatios: z
    .array(rangeSchema('gearRatios[]', 0.2, 10), { error: 'gearRatios must be a list of numbers' })
    .min(1, 'gearRatios needs at least 1 gear')
    .max(12, 'gearRatios takes at most 12 gears'),
  finalDrive: rangeSchema('finalDrive', 1, 10),
};

const fuelSafetyFields = {
  loadLinePercentOfBaro: rangeSchema('loadLinePercentOfBaro', 50, 150, '%'),
  leanAllowancePercent: rangeSchema('leanAllowancePercent', 0, 5, '%'),
};

/**
 * The fuel-safety guard of a vehicle's applies: cells whose MAP is at or above
 * `loadLinePercentOfBaro` % of the barometric pressure seen in the logs count as under load, and
 * a guess (fill, smoothing) may lean such a cell by at most `leanAllowancePercent` % unless a log
 * measured it. Defaults 90 % and 1 % (common practice, no published source).
 */
export const fuelSafetySchema = z.object(fuelSafetyFields).strict();

/** The fuel-safety settings a vehicle starts with. */
export const DEFAULT_FUEL_SAFETY = { loadLinePercentOfBaro: 90, leanAllowancePercent: 1 } as const;

/**
 * The engine as a client sends it: `stoichAfr` may be left out for a known fuel (it then takes
 * the product's value for that fuel) but is required for `custom`.
 */
export const engineInputSchema = z
  .object({ ...engineFields, stoichAfr: engineFields.stoichAfr.optional() })
  .strict()
  .superRefine((engine, ctx) => {
    if (engine.fuel === 'custom' && engine.stoichAfr === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['stoichAfr'],
        message: 'stoichAfr is required when fuel is custom',
      });
    }
  })
  // The refinement above guarantees a given ratio for `custom`, so the default always exists.
  .transform((engine) => ({
    ...engine,
    stoichAfr: engine.stoichAfr ?? (defaultStoichAfr(engine.fuel) as number),
  }));

/** The gearing the road plans use to turn RPM into gear and speed. */
export const gearingSchema = z.object(gearingFields).strict();

const labelSchema = z
  .string({ error: 'label must be text' })
  .trim()
  .min(1, 'label is required')
  .max(120, 'label must have at most 120 characters');

const descriptionSchema = z
  .string({ error: 'description must be text' })
  .trim()
  .max(2000, 'description must have at most 2000 characters');

/** Body of `POST /api/vehicles`. */
export const createVehicleRequestSchema = z
  .object({
    label: labelSchema,
    description: descriptionSchema.default(''),
    engine: engineInputSchema,
    gearing: gearingSchema,
    fuelSafety: fuelSafetySchema.default({ ...DEFAULT_FUEL_SAFETY }),
  })
  .strict();

/** Body of `POST /api/vehicles` as sent. */
export type CreateVehicleInput = z.input<typeof createVehicleRequestSchema>;
/** Body of `POST /api/vehicles` once parsed (stoichAfr resolved). */
export type CreateVehicleRequest = z.output<typeof createVehicleRequestSchema>;

/**
 * Body of `PATCH /api/vehicles/:id`: any subset, `engine` and `gearing` field by field. The
 * merged vehicle is checked again as a whole (a change to `custom` needs a `stoichAfr`).
 */
export const updateVehicleRequestSchema = z
  .object({
    label: labelSchema.optional(),
    description: descriptionSchema.optional(),
    engine: z.object(engineFields).partial().strict().optional(),
    gearing: gearingSchema.partial().strict().optional(),
    fuelSafety: fuelSafetySchema.partial().strict().optional(),
  })
  .strict()
  .refine((body) => Object.values(body).some((value) => value !== undefined), {
    message: 'give at least one of label, description, engine, gearing, fuelSafety',
  });

/** Body of `PATCH /api/vehicles/:id`. */
export type UpdateVehicleRequest = z.infer<typeof updateVehicleRequestSchema>;

/** Fields `GET /api/vehicles` can sort by. */
export const VEHICLE_SORTS = ['label', 'createdAt'] as const;

/**
 * Query of `GET /api/vehicles`: `q` searches label and description (any case), `sort` and
 * `order` (default: label ascending, or newest first when sorting by `createdAt`), and paging.
 */
export const listVehiclesQuerySchema = z
  .object({
    q: z.string().trim().max(100, 'q must have at most 100 characters').optional(),
    sort: z.enum(VEHICLE_SORTS, { error: 'sort must be label or createdAt' }).default('label'),
    order: z.enum(['asc', 'desc'], { error: 'order must be asc or desc' }).optional(),
    limit: z.coerce
      .number({ error: 'limit must be a number' })
      .int('limit must be a whole number')
      .min(1, 'limit must be between 1 and 100')
      .max(100, 'limit must be between 1 and 100')
      .default(50),
    offset: z.coerce
      .number({ error: 'offset must be a number' })
      .int('offset must be a whole number')
      .min(0, 'offset must be 0 or more')
      .default(0),
  })
  .transform((query) => ({
    ...query,
    q: query.q === '' ? undefined : query.q,
    order: query.order ?? (query.sort === 'createdAt' ? 'desc' : 'asc'),
  }));

/** Query of `GET /api/vehicles`, parsed. */
export type ListVehiclesQuery = z.output<typeof listVehiclesQuerySchema>;

/** A vehicle as the API answers it. */
export const vehicleSchema = z.object({
  id: z.string(),
  label: z.string(),
  description: z.string(),
  engine: z.object(engineFields),
  gearing: gearingSchema,
  fuelSafety: fuelSafetySchema,
  createdAt: z.string(),
  updatedAt: z.string(),
});

/** A vehicle as the API answers it. */
export type Vehicle = z.infer<typeof vehicleSchema>;

/** The engine of a stored vehicle (every field present). */
export type VehicleEngine = Vehicle['engine'];
/** The gearing of a stored vehicle. */
export type VehicleGearing = Vehicle['gearing'];
/** The fuel-safety settings of a stored vehicle. */
export type VehicleFuelSafety = Vehicle['fuelSafety'];
