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
