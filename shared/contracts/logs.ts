import { z } from 'zod';
import { CHANNELS } from '../core/channels';
import {
  CHANNEL_UNITS,
  DELIMITERS,
  validateMapping,
  type ChannelUnit,
} from '../import/column-mapping';
import { isImportError } from '../import/import-error';

/** A log's id in a path (`/logs/:id`). */
export const logIdParamSchema = z.object({ id: z.uuid('log id must be a UUID') });

/** A vehicle's id in a path (`/vehicles/:id/logs`). */
export const logVehicleParamSchema = z.object({ id: z.uuid('vehicle id must be a UUID') });

/** Road drive or dyno session. */
export const LOG_KINDS = ['road', 'dyno'] as const;
/** Road drive or dyno session. */
export type LogKind = (typeof LOG_KINDS)[number];

/** Where a log is in its parsing. */
export const LOG_STATUSES = ['queued', 'parsing', 'ready', 'failed'] as const;
/** Where a log is in its parsing. */
export type LogStatus = (typeof LOG_STATUSES)[number];

/** Where the mapping of an upload came from. */
export const MAPPING_SOURCES = ['given', 'preset', 'suggested'] as const;
/** Where the mapping of an upload came from. */
export type MappingSource = (typeof MAPPING_SOURCES)[number];

const ALL_UNITS = [...new Set(Object.values(CHANNEL_UNITS).flat())] as [
  ChannelUnit,
  ...ChannelUnit[],
];

/** One canonical channel's column and unit (the API's mapping shape). */
export const channelMappingSchema = z
  .object({
    column: z.string().min(1, 'column must name a CSV column').max(200),
    unit: z.enum(ALL_UNITS).optional(),
  })
  .strict();

/**
 * The API's column mapping: every field but `channels` optional (detected when absent), rows
 * counting lines from 0. Beyond the shape, the import stage's own `validateMapping` checks that
 * each unit fits its channel, so the rules live in one place.
 */
export const columnMappingSchema = z
  .object({
    headerRow: z.number().int().min(0).max(100_000).optional(),
    unitsRow: z.number().int().min(0).max(100_000).nullable().optional(),
    delimiter: z.enum(DELIMITERS).optional(),
    decimal: z.enum(['.', ',']).optional(),
    channels: z.partialRecord(z.enum(CHANNELS), channelMappingSchema),
  })
  .strict()
  .superRefine((mapping, ctx) => {
    try {
      validateMapping(mapping);
    } catch (err) {
      if (!isImportError(err)) throw err;
      const field = err.details.field ?? '';
      ctx.addIssue({
        code: 'custom',
        path: field === '' ? [] : field.split('.'),
        message: err.message.replace(/^mapping\.\S*\s/, ''),
      });
    }
  });

/** A column mapping as the API takes and returns it. */
export type ColumnMappingInput = z.infer<typeof columnMappingSchema>;

/** Form fields send absent values as empty strings: read those as absent. */
function emptyAsAbsent(value: unknown): unknown {
  return value === '' ? undefined : value;
}

/** A JSON text parsed into a value, or an issue saying it is not JSON. */
const jsonTextSchema = z
  .string()
  .max(64_000, 'mapping must be at most 64 000 characters')
  .transform((text, ctx) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'mapping must be a JSON object' });
      return z.NEVER;
    }
  });

/**
 * The text fields of `POST /api/vehicles/:id/logs` (multipart; the file itself is the `file`
 * part). `kind` defaults to `road`; `mapping` is a JSON text of {@link columnMappingSchema}.
 */
export const uploadLogFieldsSchema = z
  .object({
    mapping: z.preprocess(emptyAsAbsent, jsonTextSchema.pipe(columnMappingSchema).optional()),
    kind: z.preprocess(emptyAsAbsent, z.enum(LOG_KINDS).default('road')),
    ecuRevisionId: z.preprocess(emptyAsAbsent, z.uuid('ecuRevisionId must be a UUID').optional()),
  })
  .strict();

/** The text fields of an upload, parsed. */
export type UploadLogFields = z.infer<typeof uploadLogFieldsSchema>;

/** Answer of `POST /api/vehicles/:id/logs` (202): the log is stored and queued for parsing. */
export const uploadLogResponseSchema = z.object({
  id: z.string(),
  status: z.enum(LOG_STATUSES),
  mapping: columnMappingSchema,
  mappingSource: z.enum(MAPPING_SOURCES),
});

/** Answer of `POST /api/vehicles/:id/logs`. */
export type UploadLogResponse = z.infer<typeof uploadLogResponseSchema>;

/** Why parsing failed: a code (the import stage's, or `mostly_bad`, `internal`), a sentence, facts. */
export const logErrorSchema = z.object({
  code: z.string(),
  message: z.string(),
  details: z.record(z.string(), z.unknown()).optional(),
});

/** Why parsing failed. */
export type LogError = z.infer<typeof logErrorSchema>;

/** Figures of one channel; null where the channel holds no number at all. */
export const channelSummarySchema = z.object({
  min: z.number().nullable(),
  max: z.number().nullable(),
  mean: z.number().nullable(),
  nanCount: z.number(),
});

/** One problem found in a file, located by line (from 0) and CSV column. */
export const importProblemSchema = z.object({
  row: z.number(),
  column: z.string(),
  channel: z.enum(CHANNELS),
  message: z.string(),
});

/** What parsing did with the rows, and where the mapping came from. */
export const parseReportSchema = z.object({
  mappingSource: z.enum(MAPPING_SOURCES),
  /** Row counts, once parsed. */
  stats: z
    .object({
      rowsRead: z.number(),
      rowsKept: z.number(),
      rowsDroppedUnreadable: z.number(),
      rowsDroppedTimeBack: z.number(),
      blankRows: z.number(),
      problemCount: z.number(),
      droppedFraction: z.number(),
      isMostlyBad: z.boolean(),
    })
    .optional(),
  /** The first problems (at most {@link MAX_REPORTED_PROBLEMS}); `stats.problemCount` has all. */
  problems: z.array(importProblemSchema).optional(),
});

/** What parsing did with the rows. */
export type ParseReport = z.infer<typeof parseReportSchema>;

/** How many problems a parse report lists in detail. */
export const MAX_REPORTED_PROBLEMS = 50;

/** A log as `GET /api/logs/:id` answers it. */
export const logSchema = z.object({
  id: z.string(),
  vehicleId: z.string(),
  fileName: z.string(),
  sizeBytes: z.number(),
  kind: z.enum(LOG_KINDS),
  /** The revision the ECU ran while the log was recorded, if known. */
  ecuRevisionId: z.string().nullable(),
  status: z.enum(LOG_STATUSES),
  /** 0–1 while parsing; 1 once ready. */
  progress: z.number(),
  sampleCount: z.number().nullable(),
  durationS: z.number().nullable(),
  mapping: columnMappingSchema,
  error: logErrorSchema.nullable(),
  channelSummary: z.partialRecord(z.enum(CHANNELS), channelSummarySchema).nullable(),
  parseReport: parseReportSchema.nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});

/** A log as the API returns it. */
export type LogResource = z.infer<typeof logSchema>;
