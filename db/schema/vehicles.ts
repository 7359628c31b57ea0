import {
  doublePrecision,
  index,
  integer,
  pgTable,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';
import { shops } from './shops';

/** A vehicle a shop calibrates: its engine and gearing facts. */
export const vehicles = pgTable(
  'vehicles',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    label: text('label').notNull(),
    description: text('description').notNull().default(''),
    displacementL: doublePrecision('displacement_l').notNull(),
    cylinders: integer('cylinders').notNull(),
    fuel: text('fuel').notNull(),
    stoichAfr: doublePrecision('stoich_afr').notNull(),
    injectorCcMin: doublePrecision('injector_cc_min').notNull(),
    tireDiameterMm: doublePrecision('tire_diameter_mm').notNull(),
    gearRatios: doublePrecision('gear_ratios').array().notNull(),
    finalDrive: doublePrecision('final_drive').notNull(),
    /** Load line of the fuel-safety guard, % of the barometric pressure seen in the logs. */
    loadLinePercentOfBaro: doublePrecision('load_line_percent_of_baro').notNull().default(90),
    /** How far a guess may lean a cell under load that no log measured, %. */
    leanAllowancePercent: doublePrecision('lean_allowance_percent').notNull().default(1),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('vehicles_shop_idx').on(table.shopId)],
);

/** A vehicle row. */
export type VehicleRow = typeof vehicles.$inferSelect;
/** A vehicle to insert. */
export type NewVehicleRow = typeof vehicles.$inferInsert;
