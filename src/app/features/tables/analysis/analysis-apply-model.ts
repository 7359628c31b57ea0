import type { AnalysisSettingsBody, ApplyAnalysisRequest } from '@shared/contracts/analyses';
import { optionalNumber } from './analysis-setting-ranges';
import { CORE_DEFAULTS } from './analysis-settings-model';
import type {
  CellRef,
  PreviewAnalysisSettings,
  PreviewGuard,
} from '../preview/proposal-preview-compute';

/**
 * The settings an analysis was run with, read defensively from the resource (the server sends
 * them; anything that is not an object reads as none).
 */
export function settingsOfAnalysis(analysis: object): AnalysisSettingsBody {
  const settings: unknown = 'settings' in analysis ? analysis.settings : undefined;
  return typeof settings === 'object' && settings !== null
    ? (settings as AnalysisSettingsBody)
    : {};
}

/** The settings the server's apply reads from a stored analysis (see applyStoredAnalysis). */
export function applySettingsOf(
  settings: AnalysisSettingsBody,
): Omit<PreviewAnalysisSettings, 'guard'> {
  return {
    maxStepPercent: settings.maxStepPercent,
    minWeight: settings.minWeight,
    maxSpread: settings.maxSpread,
  };
}

/**
 * The settings a preview of applying `analysis` reads: the analysis's own trust and step limits
 * and its fuel-safety guard, as the server's apply takes them from the stored analysis.
 */
export function previewSettingsOf(analysis: {
  readonly settings?: unknown;
  readonly guard?: PreviewGuard;
}): PreviewAnalysisSettings {
  const settings = applySettingsOf(settingsOfAnalysis(analysis));
  const guard = analysis.guard;
  return guard
    ? {
        ...settings,
        guard: { loadLineKpa: guard.loadLineKpa, leanAllowancePercent: guard.leanAllowancePercent },
      }
    : settings;
}

/** The apply options as the form holds them. */
export interface ApplyValue {
  /** All cells, or only the cells selected in the grid. */
  scope: 'all' | 'selected';
  /** Fraction of the correction applied. */
  stepFraction: number | null;
  /** Smoothing strength of the correction field. */
  smooth: number | null;
  /** Whether cells without trusted data take their neighbours' correction. */
  fill: boolean;
  /**
   * Whether the fuel-safety guard under load holds guessed cells a fill or smoothing would lean
   * (on unless the user turns it off; off is recorded by the revision).
   */
  guard: boolean;
  /** Whether the fill stops `maxReach` cells away from trusted data. */
  limitReach: boolean;
  /** How far the fill reaches, cells (with `limitReach`). */
  maxReach: number | null;
  /** Message of the new revision ('' for the server's own). */
  message: string;
}

/**
 * Whether two apply options give the same preview: everything but the message (typing the
 * revision's message must not start a new preview).
 */
export function sameApplyOptions(a: ApplyValue, b: ApplyValue): boolean {
  return (
    a.scope === b.scope &&
    a.stepFraction === b.stepFraction &&
    a.smooth === b.smooth &&
    a.fill === b.fill &&
    a.guard === b.guard &&
    a.limitReach === b.limitReach &&
    a.maxReach === b.maxReach
  );
}

/** The apply options a new analysis starts with: its own step fraction, the core's others. */
export function defaultApplyValue(settings: AnalysisSettingsBody = {}): ApplyValue {
  return {
    scope: 'all',
    stepFraction: settings.stepFraction ?? CORE_DEFAULTS.stepFraction,
    smooth: CORE_DEFAULTS.smooth,
    fill: true,
    guard: true,
    limitReach: false,
    maxReach: 2,
    message: '',
  };
}

/**
 * The body of `POST /api/analyses/:id/apply` for a form value, the selection and the locks. The
 * guard is always named: on is the safe choice and must not depend on the server's default.
 */
export function toApplyBody(
  value: ApplyValue,
  selected: readonly CellRef[],
  locked: readonly CellRef[],
): ApplyAnalysisRequest {
  const message = value.message.trim();
  return {
    ...optionalNumber('stepFraction', value.stepFraction),
    ...optionalNumber('smooth', value.smooth),
    fill: value.fill,
    guard: value.guard,
    ...(value.fill && value.limitReach ? optionalNumber('maxReach', value.maxReach) : {}),
    ...(locked.length > 0
      ? { lockedCells: locked.map(([r, c]) => [r, c] as [number, number]) }
      : {}),
    ...(value.scope === 'selected'
      ? { onlyCells: selected.map(([r, c]) => [r, c] as [number, number]) }
      : {}),
    ...(message ? { message } : {}),
  };
}
