import type { AnalysisSettingsBody, ApplyAnalysisRequest } from '@shared/contracts/analyses';

// What the analysis panel asks the analysis store for: their own module, so the panel and the
// store each depend on it and never on each other both ways.

/** What "Run analysis" asks for. */
export interface AnalyseRequest {
  /** The chosen logs, in list order. */
  readonly logIds: string[];
  /** The settings of the form. */
  readonly settings: AnalysisSettingsBody;
}

/** What "Apply as draft" asks for. */
export interface ApplyRequest {
  /** The body of `POST /api/analyses/:id/apply`. */
  readonly body: ApplyAnalysisRequest;
}
