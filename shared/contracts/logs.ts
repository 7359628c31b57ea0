import { z } from 'zod';
import { idParam } from './id-param';
import { CHANNELS } from '../core/channels';
import {
  CHANNEL_UNITS,
  DELIMITERS,
  validateMapping,
  type ChannelUnit,
} from '../import/column-mapping';
import { isImportError } from '../import/import-error';

/** A log's id in a path (`/logs/:id`). */
export const logIdParamSchema = idParam('log');

/** A vehicle's id in a path (`/vehicles/:id/logs`). */
export const logVehicleParamSchema = idParam('vehicle');

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
  /** RPM and MAP only, logs parsed since it was kept: values at each 0.1 % of the samples. */
  permille: z.array(z.number()).optional(),
});

/** How far a log runs past the top of one of its vehicle's tables. */
export const beyondTableSchema = z.object({
  tableId: z.string(),
  tableName: z.string(),
  /** The table's top RPM breakpoint and the log's highest RPM. */
  rpmTop: z.number(),
  logRpmMax: z.number(),
  /** The table's top MAP breakpoint and the log's highest MAP, kPa absolute. */
  mapTopKpa: z.number(),
  logMapMaxKpa: z.number(),
  /** Share 0–1 of the samples above the top RPM / MAP; null for logs parsed before it was kept. */
  shareAboveRpm: z.number().nullable(),
  shareAboveMap: z.number().nullable(),
});

/** How far a log runs past the top of a table. */
export type BeyondTable = z.infer<typeof beyondTableSchema>;

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
      /** Rows with a value outside its channel's plausible range; absent from older reports. */
      rowsDroppedImplausible: z.number().optional(),
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
  /**
   * The vehicle's tables this log runs past the top of (RPM or MAP above the last breakpoint):
   * those samples land on the table's edge cells. Only on `GET /api/logs/:id`.
   */
  beyondTables: z.array(beyondTableSchema).optional(),
  createdAt: z.string(),
  updatedAt: z.string(),
});

/** A log as the API returns it. */
export type LogResource = z.infer<typeof logSchema>;

/**
 * Body of `PATCH /api/logs/:id`: what can be put right after an upload — the kind, and the
 * revision its ECU ran (null: not known; the analysis then takes the base revision).
 */
export const updateLogRequestSchema = z
  .object({
    kind: z.enum(LOG_KINDS, { error: `kind must be one of ${LOG_KINDS.join(', ')}` }).optional(),
    ecuRevisionId: z.uuid('ecuRevisionId must be a UUID').nullable().optional(),
  })
  .strict()
  .refine((body) => body.kind !== undefined || body.ecuRevisionId !== undefined, {
    message: 'give kind or ecuRevisionId',
  });

/** Body of `PATCH /api/logs/:id`. */
export type UpdateLogRequest = z.infer<typeof updateLogRequestSchema>;

/** The header signature of a mapping preset in a path (`/mapping-presets/:signature`). */
export const mappingPresetParamSchema = z.object({
  signature: z
    .string()
    .min(1, 'signature must not be empty')
    .max(20_000, 'signature must be at most 20 000 characters'),
});

/** Query of `GET /api/mapping-presets`: only the preset of one header signature, if given. */
export const mappingPresetListQuerySchema = z
  .object({
    signature: z
      .string()
      .min(1, 'signature must not be empty')
      .max(20_000, 'signature must be at most 20 000 characters')
      .optional(),
  })
  .strict();

/** Query of `GET /api/mapping-presets`, parsed. */
export type MappingPresetListQuery = z.infer<typeof mappingPresetListQuerySchema>;

/** A shop's saved column mapping for one header, as `GET /api/mapping-presets/:signature` answers. */
export const mappingPresetSchema = z.object({
  /** The header it is for (`headerSignature` of shared/import). */
  signature: z.string(),
  /** A name for people ("Columns of <file>"). */
  name: z.string(),
  /** The mapping as it was given with an upload. */
  mapping: columnMappingSchema,
  /** When it was last saved. */
  updatedAt: z.string(),
});

/** A shop's saved column mapping for one header. */
export type MappingPreset = z.infer<typeof mappingPresetSchema>;

/** Fewest and most buckets `GET /api/logs/:id/series` returns, and its default. */
export const SERIES_POINTS = { min: 100, max: 5000, default: 1500 } as const;

/** An optional number of seconds in a query string (empty counts as absent). */
const querySeconds = (name: string) =>
  z.preprocess(
    emptyAsAbsent,
    z.coerce
      .number({ error: `${name} must be a number of seconds` })
      .refine(Number.isFinite, `${name} must be a finite number of seconds`)
      .optional(),
  );

/** Query of `GET /api/logs/:id/series`. */
export const logSeriesQuerySchema = z
  .object({
    points: z.preprocess(
      emptyAsAbsent,
      z.coerce
        .number({ error: 'points must be a whole number' })
        .int('points must be a whole number')
        .min(SERIES_POINTS.min, `points must be at least ${SERIES_POINTS.min}`)
        .max(SERIES_POINTS.max, `points must be at most ${SERIES_POINTS.max}`)
        .default(SERIES_POINTS.default),
    ),
    fromS: querySeconds('fromS'),
    toS: querySeconds('toS'),
  })
  .strict()
  .refine((q) => q.fromS === undefined || q.toS === undefined || q.toS > q.fromS, {
    path: ['toS'],
    message: 'toS must be later than fromS',
  });

/** Query of `GET /api/logs/:id/series`, parsed. */
export type LogSeriesQuery = z.infer<typeof logSeriesQuerySchema>;

/** Per bucket: the lowest, highest and mean value (null where the bucket has none). */
export const seriesEnvelopeSchema = z.object({
  min: z.array(z.number().nullable()),
  max: z.array(z.number().nullable()),
  mean: z.array(z.number().nullable()),
});

/** Per bucket: the lowest, highest and mean value. */
export type SeriesEnvelope = z.infer<typeof seriesEnvelopeSchema>;

/** One line of a filter funnel (as an analysis's `filterReport.logs[].funnel`). */
export const funnelLineSchema = z.object({
  rule: z.string(),
  label: z.string(),
  status: z.enum(['applied', 'skipped']),
  note: z.string().optional(),
  /** What the rule found in the log itself (the fuel-cut rule: the lambda ceiling). */
  detail: z.object({ ceilingLambda: z.number().optional() }).optional(),
  removed: z.number(),
  remaining: z.number(),
});

/** One line of a filter funnel. */
export type FunnelLine = z.infer<typeof funnelLineSchema>;

/** The wideband delay an analysis would apply to the log. */
export const delayUsedSchema = z.object({
  tau0S: z.number(),
  kGrams: z.number(),
  source: z.enum(['estimate', 'settings']),
});

/** Answer of `GET /api/logs/:id/series`: a bucketed window of the log and its default filter. */
export const logSeriesSchema = z.object({
  /** Each bucket's time, s (its middle; a sample's own time when the window is not bucketed). */
  timeS: z.array(z.number()),
  channels: z.object({
    rpm: seriesEnvelopeSchema,
    mapKpa: seriesEnvelopeSchema,
    lambda: seriesEnvelopeSchema,
    lambdaTarget: seriesEnvelopeSchema,
    /** Null when the log has no throttle channel. */
    throttlePct: seriesEnvelopeSchema.nullable(),
  }),
  /** Per bucket the fraction 0–1 of its samples the default filter keeps; null without a table. */
  kept: z.array(z.number().nullable()).nullable(),
  /** The default filter's funnel over the whole log; null when the vehicle has no table. */
  funnel: z.array(funnelLineSchema).nullable(),
  /** The delay applied before filtering; null when the vehicle has no table. */
  delayUsed: delayUsedSchema.nullable(),
  /** The revision whose VE gave the airflow behind the delay; null when the vehicle has none. */
  revisionId: z.string().nullable(),
  /** The window used, s: the request clipped to the log. */
  rangeS: z.tuple([z.number(), z.number()]),
  /** Samples inside the window. */
  sampleCount: z.number(),
  /** Whether every bucket is one sample. */
  isExact: z.boolean(),
});

/** Answer of `GET /api/logs/:id/series`. */
export type LogSeries = z.infer<typeof logSeriesSchema>;
