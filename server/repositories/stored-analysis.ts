import { z } from 'zod';
import {
  analysisSettingsSchema,
  filterReportSchema,
  leanFlagSchema,
} from '../../shared/contracts/analyses';

/** The per-cell grids an analysis keeps, as JSON rows (null = no value). */
export const STORED_CELL_GRIDS = [
  'count',
  'weight',
  'ratio',
  'spread',
  'effectiveCount',
  'lambdaError',
  'worstLean',
  'lambdaMeasured',
  'lambdaCommanded',
] as const;

/** One stored grid's name. */
export type StoredCellGrid = (typeof STORED_CELL_GRIDS)[number];

const jsonGrid = z.array(z.array(z.number().nullable()));

/** How an analysis's per-cell results are stored. */
export const storedCellsSchema = z.object({
  count: jsonGrid,
  weight: jsonGrid,
  ratio: jsonGrid,
  spread: jsonGrid,
  effectiveCount: jsonGrid,
  lambdaError: jsonGrid,
  worstLean: jsonGrid,
  lambdaMeasured: jsonGrid,
  lambdaCommanded: jsonGrid,
}) satisfies z.ZodType<Record<StoredCellGrid, (number | null)[][]>>;

/** How an analysis's per-cell results are stored. */
export type StoredCells = z.infer<typeof storedCellsSchema>;

/** How an analysis's proposal is stored. */
export const storedProposalSchema = z.object({
  /** Proposed VE, `[row][col]`. */
  values: jsonGrid,
  /** Applied ratio. */
  ratio: jsonGrid,
  /** Change in %. */
  changePercent: jsonGrid,
  /** Status per cell, `[row][col]`. */
  status: z.array(z.array(z.enum(['trusted', 'too_little_data', 'locked', 'no_data']))),
});

/** How an analysis's proposal is stored. */
export type StoredProposal = z.infer<typeof storedProposalSchema>;

/** The stored JSON of an analysis, parsed once when read (a drifted row fails loudly here). */
export const storedAnalysisJsonSchema = z.object({
  settings: analysisSettingsSchema,
  cells: storedCellsSchema,
  proposal: storedProposalSchema,
  filterReport: filterReportSchema,
  leanFlags: z.array(leanFlagSchema),
});

/** An analysis as stored, its JSON parsed. */
export interface StoredAnalysis extends z.infer<typeof storedAnalysisJsonSchema> {
  id: string;
  shopId: string;
  tableId: string;
  baseRevisionId: string;
  logIds: string[];
  createdBy: string;
  createdAt: Date;
}
