import { z } from 'zod';
import { idParam } from './id-param';
import { validateAxis, validateTable } from '../core/table';

/** A table id in a path (`/tables/:id`). */
export const tableIdParamSchema = idParam('table');

/** A revision id in a path (`/revisions/:id`). */
export const revisionIdParamSchema = idParam('revision');

/** An id in a path, once parsed. */
export type { IdParams } from './id-param';

/** The most breakpoints an axis may have (ECU tables are 8 to 32 wide; leave room). */
export const MAX_BREAKPOINTS = 64;
/** The lowest VE in percent a cell may hold. */
export const MIN_VE = 1;
/** The highest VE in percent a cell may hold (well-built boosted engines reach 150–200). */
export const MAX_VE = 300;

function axisSchema(name: string, min: number, max: number, unit: string) {
  return z
    .array(
      z
        .number({ error: `${name} breakpoints must be numbers` })
        .min(min, `${name} breakpoints must be between ${min} and ${max} ${unit}`)
        .max(max, `${name} breakpoints must be between ${min} and ${max} ${unit}`),
      { error: `${name} must be a list of numbers` },
    )
    .min(2, `${name} needs at least 2 breakpoints`)
    .max(MAX_BREAKPOINTS, `${name} takes at most ${MAX_BREAKPOINTS} breakpoints`);
}

/** VE cells `[row][col]`, rows following the MAP axis; each in percent within MIN_VE..MAX_VE. */
export const veValuesSchema = z
  .array(
    z.array(
      z
        .number({ error: 'values must hold numbers only' })
        .min(MIN_VE, `VE must be between ${MIN_VE} and ${MAX_VE} %`)
        .max(MAX_VE, `VE must be between ${MIN_VE} and ${MAX_VE} %`),
      { error: 'each row of values must be a list of numbers' },
    ),
    { error: 'values must be a list of rows' },
  )
  .min(2, 'values needs at least 2 rows')
  .max(MAX_BREAKPOINTS, `values takes at most ${MAX_BREAKPOINTS} rows`);

/** The message of an error thrown by the domain core's checks. */
function messageOf(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

/** Body of `POST /api/vehicles/:id/tables`: axes strictly ascending, values matching them. */
export const createTableRequestSchema = z
  .object({
    name: z
      .string({ error: 'name must be text' })
      .trim()
      .min(1, 'name is required')
      .max(120, 'name must have at most 120 characters'),
    rpmAxis: axisSchema('rpmAxis', 0, 30000, 'rpm'),
    mapAxisKpa: axisSchema('mapAxisKpa', 1, 1000, 'kPa'),
    values: veValuesSchema,
  })
  .strict()
  .superRefine((body, ctx) => {
    // The domain core decides what a well-formed table is; we only place its verdict.
    for (const axis of ['rpmAxis', 'mapAxisKpa'] as const) {
      try {
        validateAxis(body[axis], axis);
      } catch (err) {
        ctx.addIssue({ code: 'custom', path: [axis], message: messageOf(err) });
        return;
      }
    }
    try {
      validateTable(body, 'table');
    } catch (err) {
      ctx.addIssue({ code: 'custom', path: ['values'], message: messageOf(err) });
    }
  });

/** Body of `POST /api/vehicles/:id/tables`. */
export type CreateTableRequest = z.infer<typeof createTableRequestSchema>;

/** Body of `POST /api/tables/:id/revisions`; the values are checked against the table's axes. */
export const createRevisionRequestSchema = z
  .object({
    parentId: z.uuid('parentId must be a revision id (UUID)'),
    values: veValuesSchema,
    message: z
      .string({ error: 'message must be text' })
      .trim()
      .max(500, 'message must have at most 500 characters')
      .default(''),
  })
  .strict();

/** Body of `POST /api/tables/:id/revisions`. */
export type CreateRevisionRequest = z.infer<typeof createRevisionRequestSchema>;

/** A VE table as the API answers it (its values live in its revisions). */
export const veTableSchema = z.object({
  id: z.string(),
  vehicleId: z.string(),
  name: z.string(),
  rpmAxis: z.array(z.number()),
  mapAxisKpa: z.array(z.number()),
  /** The newest revision. */
  headRevisionId: z.string().nullable(),
  createdAt: z.string(),
});

/** A VE table as the API answers it. */
export type VeTableResource = z.infer<typeof veTableSchema>;

/** Where a revision is in review (the same values as the database enum). */
export const REVISION_STATUSES = ['draft', 'in_review', 'approved', 'sent_back'] as const;

/** Where a revision is in review. */
export type RevisionStatus = (typeof REVISION_STATUSES)[number];

/** A revision without its values, as `GET /api/tables/:id/revisions` lists it. */
export const revisionSummarySchema = z.object({
  id: z.string(),
  tableId: z.string(),
  parentId: z.string().nullable(),
  number: z.number().int(),
  status: z.enum(REVISION_STATUSES),
  message: z.string(),
  authorId: z.string(),
  authorName: z.string(),
  analysisId: z.string().nullable(),
  createdAt: z.string(),
});

/** A revision without its values. */
export type RevisionSummary = z.infer<typeof revisionSummarySchema>;

/**
 * How each cell of an applied revision got its value: `measured` (trusted data), `filled` (a
 * guess from the neighbours or smoothing), `held` (a guess under load would have leaned it: kept,
 * needs data), `locked`, or `unchanged`.
 */
export const CELL_ORIGINS = ['measured', 'filled', 'held', 'locked', 'unchanged'] as const;

/** How a cell of an applied revision got its value. */
export type CellOriginName = (typeof CELL_ORIGINS)[number];

/** The fuel-safety guard an apply ran with. */
export const appliedGuardSchema = z.object({
  /** MAP at or above which a cell counted as under load, kPa absolute. */
  loadLineKpa: z.number(),
  /** The vehicle's load line, % of the barometric pressure. */
  loadLinePercentOfBaro: z.number(),
  /** How far a guess could lean a cell under load, %. */
  leanAllowancePercent: z.number(),
  /** The barometric pressure behind the line, kPa. */
  baroKpa: z.number(),
  /** Where that pressure came from: the logs' barometer, MAP with the engine off, or assumed. */
  baroSource: z.enum(['logged', 'engine_off', 'assumed']),
});

/** The fuel-safety guard an apply ran with. */
export type AppliedGuard = z.infer<typeof appliedGuardSchema>;

/** A cell as `[row, col]`. */
const cellIndexSchema = z.tuple([z.number().int().min(0), z.number().int().min(0)]);

/** How an applied revision was made; recorded with the revision. */
export const appliedRecordSchema = z.object({
  /** The analysis applied. */
  analysisId: z.string(),
  /** Fraction of each correction applied. */
  stepFraction: z.number(),
  /** Smoothing strength used. */
  smooth: z.number(),
  /** Whether cells without trusted data were filled from their neighbours. */
  fill: z.boolean(),
  /** How far the fill reached, cells (null: everywhere). */
  maxReach: z.number().nullable(),
  /** Cells in the selection applied to (null: the whole table). */
  selectedCells: z.number().int().nullable(),
  /** The guard, or null when the user turned it off for this apply. */
  guard: appliedGuardSchema.nullable(),
  /** Cells under load the guard held: they need data (the next session plan's first targets). */
  heldCells: z.array(cellIndexSchema),
  /** How many cells got their value each way. */
  counts: z.object({
    measured: z.number().int(),
    filled: z.number().int(),
    held: z.number().int(),
    locked: z.number().int(),
    unchanged: z.number().int(),
  }),
  /** How each cell got its value, `[row][col]`. */
  origin: z.array(z.array(z.enum(CELL_ORIGINS))),
});

/** How an applied revision was made. */
export type AppliedRecord = z.infer<typeof appliedRecordSchema>;

/** A revision with its values, as `GET /api/revisions/:id` answers it. */
export const revisionSchema = revisionSummarySchema.extend({
  values: z.array(z.array(z.number())),
  /** How it was applied from an analysis; null for a revision saved from the grid. */
  applied: appliedRecordSchema.nullable(),
});

/** A revision with its values. */
export type Revision = z.infer<typeof revisionSchema>;

/** The file formats a revision exports to. */
export const EXPORT_FORMATS = ['csv', 'tsv'] as const;

/** Query of `GET /api/revisions/:id/export`. */
export const exportRevisionQuerySchema = z.object({
  format: z.enum(EXPORT_FORMATS, { error: 'format must be csv or tsv' }).default('csv'),
});

/** Query of `GET /api/revisions/:id/export`. */
export type ExportRevisionQuery = z.infer<typeof exportRevisionQuerySchema>;

/** Query of `GET /api/revisions/compare`. */
export const compareRevisionsQuerySchema = z.object({
  a: z.uuid('a must be a revision id (UUID)'),
  b: z.uuid('b must be a revision id (UUID)'),
});

/** Query of `GET /api/revisions/compare`. */
export type CompareRevisionsQuery = z.infer<typeof compareRevisionsQuerySchema>;

/** Answer of `GET /api/revisions/compare`: b against a, grids `[row][col]`, percent of a. */
export const revisionComparisonSchema = z.object({
  a: revisionSchema,
  b: revisionSchema,
  diff: z.object({
    absolute: z.array(z.array(z.number())),
    percent: z.array(z.array(z.number())),
  }),
  summary: z.object({
    cellsChanged: z.number(),
    meanChangePct: z.number(),
    maxChangePct: z.number(),
    richer: z.number(),
    leaner: z.number(),
  }),
});

/** Answer of `GET /api/revisions/compare`. */
export type RevisionComparison = z.infer<typeof revisionComparisonSchema>;
