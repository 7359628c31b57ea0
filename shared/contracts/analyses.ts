import { z } from 'zod';

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
export interface AnalysisCell {
  /** Samples touching the cell. */
  samples: number;
  /** Total bilinear weight (the cell's coverage). */
  weight: number;
  /** Weighted mean correction ratio. */
  ratio: number | null;
  /** Weighted spread of the ratio. */
  spread: number | null;
  /** Effective sample count. */
  effectiveCount: number;
  /** Weighted mean lambda error in %, positive = leaner than commanded. */
  lambdaErrorPct: number | null;
  /** Worst lean excursion under load, %. */
  worstLeanPct: number | null;
  /** Mean measured lambda. */
  lambdaMeasured: number | null;
  /** Mean commanded lambda. */
  lambdaCommanded: number | null;
  /** Proposed VE at the analysis's step fraction. */
  proposal: number | null;
  /** Proposed change of VE in %, positive = VE up. */
  changePct: number | null;
  /** `trusted`, `too_little_data`, `locked` or `no_data`. */
  status: string;
}

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
  settings: Record<string, unknown>;
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
