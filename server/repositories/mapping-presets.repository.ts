import { and, asc, eq, sql } from 'drizzle-orm';
import { mappingPresets } from '../../db/schema';
import type { ColumnMapping } from '../../shared/import';
import type { Executor } from '../db';

/** A shop's saved column mapping for one header. */
export interface MappingPreset {
  /** The preset's id. */
  id: string;
  /** A name for people. */
  name: string;
  /** The header it was made for (`headerSignature` of the columns). */
  headerSignature: string;
  /** The mapping as its author gave it (unchecked JSON: check before use). */
  mapping: unknown;
  /** When it was last saved (the table's `created_at`, moved on at each save). */
  updatedAt: Date;
}

const presetColumns = {
  id: mappingPresets.id,
  name: mappingPresets.name,
  headerSignature: mappingPresets.headerSignature,
  mapping: mappingPresets.mapping,
  updatedAt: mappingPresets.createdAt,
};

/** A shop's preset for a header signature, or null when the shop has none. */
export async function findPresetBySignature(
  db: Executor,
  shopId: string,
  headerSignature: string,
): Promise<MappingPreset | null> {
  const [row] = await db
    .select(presetColumns)
    .from(mappingPresets)
    .where(
      and(eq(mappingPresets.shopId, shopId), eq(mappingPresets.headerSignature, headerSignature)),
    )
    .limit(1);
  return row ?? null;
}

/** A shop's presets, by header signature. */
export async function listPresets(db: Executor, shopId: string): Promise<MappingPreset[]> {
  return db
    .select(presetColumns)
    .from(mappingPresets)
    .where(eq(mappingPresets.shopId, shopId))
    .orderBy(asc(mappingPresets.headerSignature));
}

/**
 * Saves a shop's mapping for a header signature: a new preset, or the newest mapping replacing
 * the one saved before for the same header (one preset per header and shop). The row has no
 * separate update time, so `created_at` moves on with each save and reads as "last saved".
 */
export async function savePreset(
  db: Executor,
  shopId: string,
  preset: { name: string; headerSignature: string; mapping: ColumnMapping; createdBy: string },
): Promise<void> {
  const mapping = JSON.parse(JSON.stringify(preset.mapping)) as Record<string, unknown>;
  await db
    .insert(mappingPresets)
    .values({ shopId, ...preset, mapping })
    .onConflictDoUpdate({
      target: [mappingPresets.shopId, mappingPresets.headerSignature],
      set: {
        name: sql`excluded.name`,
        mapping: sql`excluded.mapping`,
        createdBy: sql`excluded.created_by`,
        createdAt: sql`now()`,
      },
    });
}
