import { z } from 'zod';
import { delayUsedSchema, funnelLineSchema } from './logs';
import { appliedGuardSchema } from './tables';

const seconds = z.number().min(0).max(30);

/** One filter rule of an analysis, as the API takes it (see shared/filter). */
export const filterRuleSchema = z.discriminatedUnion('kind', [
  z
    .object({ kind: z.literal('warmUp'), minEctC: z.number().min(-40).max(130).optional() })
    .strict(),
  z
    .object({
      kind: z.literal('fuelCut'),
      leanLimitLambda: z.number().min(1).max(10).optional(),
      settleS: seconds.optional(),
    })
    .strict(),
  z
    .object({
      kind: z.literal('tipIn'),
      maxTpsRatePctPerS: z.number().positive().max(1000).optional(),
      settleS: seconds.optional(),
      direction: z.enum(['both', 'opening']).optional(),
    })
    .strict(),
  z
    .object({
      kind: z.literal('rpmRate'),
      maxRpmPerS: z.number().positive().max(100000).optional(),
      settleS: seconds.optional(),
    })
    .strict(),
  z
    .object({
      kind: z.literal('mapRate'),
      maxKpaPerS: z.number().positive().max(10000).optional(),
      settleS: seconds.optional(),
    })
    .strict(),
  z
    .object({
      kind: z.literal('lambdaRange'),
      min: z.number().positive().max(5).optional(),
      max: z.number().positive().max(10).optional(),
    })
    .strict(),
  z.object({ kind: z.literal('loopMode'), keep: z.enum(['closed', 'open']) }).strict(),
  z.object({ kind: z.literal('knock'), maxDeg: z.number().min(0).max(60).optional() }).strict(),
  z.object({ kind: z.literal('expression'), source: z.string().min(1).max(500) }).strict(),
]);

/** Settings of an analysis; all optional, the defaults give a sound result. */
export const analysisSettingsSchema = z
  .object({
    delay: z
      .object({
        tau0S: z.number().min(0).max(2).optional(),
        kGrams: z.number().min(0).max(50).optional(),
        estimate: z.boolean().optional(),
      })
      .strict()
      .optional(),
    filters: z.array(filterRuleSchema).max(30).optional(),
    stepFraction: z.number().gt(0).max(1).optional(),
    maxStepPercent: z.number().gt(0).max(100).optional(),
    minWeight: z.number().min(0).max(1e6).optional(),
    maxSpread: z.number().gt(0).max(1).optional(),
    leanLoadKpa: z.number().min(0).max(500).optional(),
    warnLeanPercent: z.number().gt(0).max(100).optional(),
  })
  .strict();

/** Settings of an analysis. */
export type AnalysisSettingsBody = z.infer<typeof analysisSettingsSchema>;

/** Body of `POST /api/tables/:id/analyses`. */
export const createAnalysisRequestSchema = z
  .object({
    baseRevisionId: z.uuid('baseRevisionId must be a UUID'),
    logIds: z.array(z.uuid('each log id must be a UUID')).min(1, 'give at least one log').max(50),
    settings: analysisSettingsSchema.optional(),
  })
  .strict();

/** Body of `POST /api/tables/:id/analyses`. */
export type CreateAnalysisRequest = z.infer<typeof createAnalysisRequestSchema>;

/** A cell as `[row, col]`. */
const cellSchema = z.tuple([z.number().int().min(0), z.number().int().min(0)]);

/** Body of `POST /api/analyses/:id/apply`. */
export const applyAnalysisRequestSchema = z
  .object({
    stepFraction: z.number().gt(0, 'stepFraction must be > 0').max(1).optional(),
    smooth: z.number().min(0).max(1).optional(),
    fill: z.boolean().optional(),
    maxReach: z.number().int().min(0).max(100).optional(),
    lockedCells: z.array(cellSchema).max(10000).optional(),
    onlyCells: z.array(cellSchema).max(10000).optional(),
    /**
     * The fuel-safety guard under load (default on). `false` is an explicit choice: the revision
     * records it and its message says so.
     */
    guard: z.boolean().optional(),
    message: z.string().max(2000).optional(),
  })
  .strict();

/** Body of `POST /api/analyses/:id/apply`. */
export type ApplyAnalysisRequest = z.infer<typeof applyAnalysisRequestSchema>;

/** The results of one cell of an analysis (null figures where the cell saw no data). */
export const analysisCellSchema = z.object({
  /** Samples touching the cell. */
  samples: z.number(),
  /** Total bilinear weight (the cell's coverage). */
  weight: z.number(),
  /** Weighted mean correction ratio. */
  ratio: z.number().nullable(),
  /** Weighted spread of the ratio. */
  spread: z.number().nullable(),
  /** Effective sample count. */
  effectiveCount: z.number(),
  /** Weighted mean lambda error in %, positive = leaner than commanded. */
  lambdaErrorPct: z.number().nullable(),
  /** Worst lean excursion under load, %. */
  worstLeanPct: z.number().nullable(),
  /** Mean measured lambda. */
  lambdaMeasured: z.number().nullable(),
  /** Mean commanded lambda. */
  lambdaCommanded: z.number().nullable(),
  /** Proposed VE at the analysis's step fraction. */
  proposal: z.number().nullable(),
  /** Proposed change of VE in %, positive = VE up. */
  changePct: z.number().nullable(),
  /** `trusted`, `too_little_data`, `locked` or `no_data`. */
  status: z.enum(['trusted', 'too_little_data', 'locked', 'no_data']),
});

/** The results of one cell of an analysis. */
export type AnalysisCell = z.infer<typeof analysisCellSchema>;

/** How loudly a lean cell is shown. */
export const LEAN_SEVERITIES = ['watch', 'warn', 'abort'] as const;

/**
 * `abort` ("stop": stop loading the engine there until it is richer), `warn` ("warning": richen
 * it before the next full-load run), both on a cell with the weight a proposal trusts; `watch`:
 * as lean, but on too little data to act on (log the cell again).
 */
export type LeanSeverity = (typeof LEAN_SEVERITIES)[number];

/** A cell measured leaner than commanded under load. */
export const leanFlagSchema = z.object({
  /** Row (MAP breakpoint index). */
  row: z.number().int(),
  /** Column (RPM breakpoint index). */
  col: z.number().int(),
  /** The cell's RPM breakpoint. */
  rpm: z.number(),
  /** The cell's MAP breakpoint, kPa. */
  mapKpa: z.number(),
  /** Weighted mean lean error, %. */
  leanPercent: z.number(),
  /** Worst single lean excursion, % (null when no sample under load touched it). */
  worstLeanPercent: z.number().nullable(),
  /** The cell's weight: how much data the flag rests on. */
  weight: z.number(),
  /** See {@link LeanSeverity}. */
  severity: z.enum(LEAN_SEVERITIES),
});

/** A cell measured leaner than commanded under load. */
export type LeanFlag = z.infer<typeof leanFlagSchema>;

/** The barometric pressure an analysis found in its logs, and where it came from. */
export const analysisBaroSchema = z.object({
  /** Barometric pressure, kPa absolute. */
  kpa: z.number(),
  /** The logs' barometer, MAP with the engine stopped, or assumed (standard sea level). */
  source: z.enum(['logged', 'engine_off', 'assumed']),
});

/** The barometric pressure an analysis found in its logs. */
export type AnalysisBaro = z.infer<typeof analysisBaroSchema>;

/** What one log contributed to an analysis. */
export const logFilterReportSchema = z.object({
  /** The log. */
  logId: z.string(),
  /** Samples in the log. */
  samples: z.number(),
  /** Samples kept by the filters. */
  kept: z.number(),
  /** The filter funnel, rule by rule. */
  funnel: z.array(funnelLineSchema),
  /** The wideband delay applied. */
  delayUsed: delayUsedSchema,
  /** The log's own delay estimate (null when estimation was off). */
  delayEstimate: z
    .object({
      tau0S: z.number(),
      kGrams: z.number(),
      method: z.string(),
      quality: z.string(),
      reason: z.string().optional(),
      events: z.number(),
    })
    .nullable()
    .optional(),
});

/** What one log contributed to an analysis. */
export type LogFilterReport = z.infer<typeof logFilterReportSchema>;

/** What the filters did, log by log, and what the analysis counted. */
export const filterReportSchema = z.object({
  logs: z.array(logFilterReportSchema),
  /** Kept samples spread over the table. */
  samplesUsed: z.number().optional(),
  /** Cells with enough data to be trusted. */
  cellsTrusted: z.number().optional(),
  /** The barometric pressure behind the guard's load line (absent on older analyses). */
  baro: analysisBaroSchema.optional(),
});

/** What the filters did. */
export type FilterReport = z.infer<typeof filterReportSchema>;

/** An analysis as `POST /api/tables/:id/analyses` and `GET /api/analyses/:id` answer it. */
export const analysisResourceSchema = z.object({
  id: z.string(),
  tableId: z.string(),
  /** The revision the proposal starts from. */
  baseRevisionId: z.string(),
  /** The logs analysed. */
  logIds: z.array(z.string()),
  /** The settings it ran with (empty: the defaults). */
  settings: analysisSettingsSchema,
  /** Per-cell results `[row][col]`. */
  cells: z.array(z.array(analysisCellSchema)),
  /** Proposed VE `[row][col]` (null where the table has no value). */
  proposal: z.array(z.array(z.number().nullable())),
  /** Per log: samples, kept, the filter funnel, the delay estimate and the delay used. */
  filterReport: filterReportSchema,
  /** Cells measured leaner than commanded under load: stop, then warning, then watch. */
  leanFlags: z.array(leanFlagSchema),
  /** The fuel-safety guard an apply uses unless the user turns it off (`guard: false`). */
  guard: appliedGuardSchema,
  /** When it ran, ISO 8601. */
  createdAt: z.string(),
});

/** An analysis as the API answers it. */
export type AnalysisResource = z.infer<typeof analysisResourceSchema>;

/** Query of `GET /api/tables/:id/analyses`: paging of the table's analyses, newest first. */
export const listAnalysesQuerySchema = z.object({
  limit: z.coerce
    .number({ error: 'limit must be a number' })
    .int('limit must be a whole number')
    .min(1, 'limit must be between 1 and 100')
    .max(100, 'limit must be between 1 and 100')
    .default(20),
  offset: z.coerce
    .number({ error: 'offset must be a number' })
    .int('offset must be a whole number')
    .min(0, 'offset must be 0 or more')
    .default(0),
});

/** Query of `GET /api/tables/:id/analyses`, parsed. */
export type ListAnalysesQuery = z.output<typeof listAnalysesQuerySchema>;

/** An analysis in a list: what it ran on and what it found, without its per-cell grids. */
export interface AnalysisSummary {
  /** The analysis id. */
  id: string;
  /** Its table. */
  tableId: string;
  /** The revision it was run against. */
  baseRevisionId: string;
  /** That revision's number within the table. */
  baseRevisionNumber: number;
  /** The logs analysed. */
  logIds: string[];
  /** The settings it ran with (empty: the defaults). */
  settings: AnalysisSettingsBody;
  /** When it ran, ISO 8601. */
  createdAt: string;
  /** Cells with enough data to be trusted. */
  trustedCells: number;
  /** Cells flagged lean under load as "stop" or "warning" ("watch" flags are left out). */
  leanFlagCount: number;
  /** Who ran it (null if that account is gone). */
  authorName: string | null;
}

/** Fewest and most samples `GET /api/analyses/:id/samples` returns per request. */
export const SAMPLES_MAX_RANGE = { min: 100, max: 20000, default: 4000 } as const;

/** Query of `GET /api/analyses/:id/samples`: at most how many samples to return. */
export const analysisSamplesQuerySchema = z.object({
  max: z.coerce
    .number({ error: 'max must be a number' })
    .int('max must be a whole number')
    .min(SAMPLES_MAX_RANGE.min, 'max must be between 100 and 20000')
    .max(SAMPLES_MAX_RANGE.max, 'max must be between 100 and 20000')
    .default(SAMPLES_MAX_RANGE.default),
});

/** Query of `GET /api/analyses/:id/samples`, parsed. */
export type AnalysisSamplesQuery = z.output<typeof analysisSamplesQuerySchema>;

/**
 * The samples an analysis kept (after delay alignment and the filters), as columns of equal
 * length, thinned evenly to at most `max`.
 */
export interface AnalysisSamples {
  /** Engine speed per sample. */
  rpm: number[];
  /** MAP per sample, kPa absolute. */
  mapKpa: number[];
  /** Lambda error λ_meas/λ_cmd − 1 in %, positive = leaner than commanded (as the cells). */
  lambdaErrorPct: number[];
  /** Which of the analysis's logs (index into its `logIds`) each sample came from. */
  logIndex: number[];
  /** Kept samples in all, before thinning. */
  total: number;
  /** Samples returned (the length of each column). */
  returned: number;
}
