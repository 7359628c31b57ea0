import {
  columnMappingSchema,
  type MappingPreset as MappingPresetResource,
} from '../../shared/contracts/logs';
import type { Database } from '../db';
import { notFound } from '../errors/app-error';
import {
  findPresetBySignature,
  listPresets,
  type MappingPreset,
} from '../repositories/mapping-presets.repository';
import type { SessionUserRecord } from '../repositories/users.repository';

/** A stored preset as the API answers it; null when its mapping no longer passes the schema. */
function presetResource(preset: MappingPreset): MappingPresetResource | null {
  const mapping = columnMappingSchema.safeParse(preset.mapping);
  if (!mapping.success) return null;
  return {
    signature: preset.headerSignature,
    name: preset.name,
    mapping: mapping.data,
    updatedAt: preset.updatedAt.toISOString(),
  };
}

/**
 * The shop's saved mapping for a header signature (as `headerSignature` of shared/import makes
 * it); 404 when the shop has none, or only one the upload would not use any more either.
 */
export async function getMappingPreset(
  db: Database,
  user: SessionUserRecord,
  signature: string,
): Promise<MappingPresetResource> {
  const preset = await findPresetBySignature(db, user.shopId, signature);
  const resource = preset && presetResource(preset);
  if (!resource) throw notFound('Mapping preset');
  return resource;
}

/**
 * The shop's saved mappings, by header signature; with `signature`, only that header's (none
 * or one), so a client can ask whether a preset exists without an error answer.
 */
export async function listMappingPresets(
  db: Database,
  user: SessionUserRecord,
  signature?: string,
): Promise<MappingPresetResource[]> {
  const presets =
    signature === undefined
      ? await listPresets(db, user.shopId)
      : [await findPresetBySignature(db, user.shopId, signature)].filter((p) => p !== null);
  return presets.flatMap((preset) => presetResource(preset) ?? []);
}
