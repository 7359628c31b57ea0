import {
  Injectable,
  computed,
  effect,
  inject,
  linkedSignal,
  signal,
  untracked,
} from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import type { AnalysisSummary, ApplyAnalysisRequest } from '@shared/contracts/analyses';
import type { Revision } from '@shared/contracts/tables';
import type { LoadGuard } from '@shared/correct/load-guard';
import { catchError, map, of, switchMap, throwError } from 'rxjs';
import { apiErrorMessage } from '../../../core/api/api-error';
import { AnalysesApi, type AnalysisResource } from '../../../core/api/analyses-api';
import { TablesApi } from '../../../core/api/tables-api';
import {
  type ApplyValue,
  previewSettingsOf,
  sameApplyOptions,
  toApplyBody,
} from './analysis-apply-model';
import type { AnalyseRequest } from './analysis-requests';
import {
  type PreviewInput,
  type PreviewResult,
  loadGuardOf,
} from '../preview/proposal-preview-compute';
import { ProposalPreview } from '../preview/proposal-preview';
import { TableStore } from '../table-store';

/** The analysis shown and what belongs to it. */
interface Shown {
  /** The analysis, run here or opened again; null for none. */
  readonly analysis: AnalysisResource | null;
  /** VE of the revision an earlier analysis ran on, when that is not the loaded head. */
  readonly openedBaseValues: readonly (readonly number[])[] | null;
  /** The server's refusal of the last run, null when it ran or none was run. */
  readonly error: string | null;
}

/** The message of the revision that keeps unsaved edits before an apply on top of them. */
export const EDITS_BEFORE_APPLY_MESSAGE = 'Edits saved before applying an analysis';

const NOTHING_SHOWN: Shown = { analysis: null, openedBaseValues: null, error: null };

/** The analyses list as last read, and the table it belongs to. */
interface ListSource {
  readonly tableId: string | null;
  readonly items: readonly AnalysisSummary[] | null;
}

/**
 * The workspace's analysis: the one shown (run here or an earlier one opened again), the table's
 * earlier analyses, running one, applying it as a draft, and the live preview of that apply with
 * the panel's options (debounced, in a Web Worker through {@link ProposalPreview}). It reads the
 * table, the base revision, the selection, the locks and the busy state from {@link TableStore}
 * and never the other way round. Provided with `TableStore` and `ProposalPreview` by the
 * workspace page; failures are told through the table store's `perform`.
 */
@Injectable()
export class AnalysisStore {
  private readonly tables = inject(TableStore);
  private readonly analysesApi = inject(AnalysesApi);
  private readonly tablesApi = inject(TablesApi);
  private readonly previewer = inject(ProposalPreview);

  /** Empty again whenever the table store loads a head revision (after a save or apply too). */
  private readonly shown = linkedSignal<Revision | null, Shown>({
    source: this.tables.revision,
    computation: () => NOTHING_SHOWN,
  });
  /** The panel's apply options; null until it sends them or while one is out of range. */
  private readonly applyOptions = signal<ApplyValue | null>(null, {
    equal: (a, b) => (a && b ? sameApplyOptions(a, b) : a === b),
  });
  /** The table's analyses, read again for every head revision loaded and after every run. */
  private readonly list = rxResource({
    params: () => {
      const head = this.tables.revision();
      return head ? { tableId: head.tableId, headId: head.id } : undefined;
    },
    stream: ({ params }) =>
      this.analysesApi.listForTable(params.tableId).pipe(map((page) => page.items)),
  });
  /**
   * The list as last read for this table: a failed read again keeps it (it is a convenience
   * beside the analysis shown; a miss is not worth a message), another table starts empty.
   */
  private readonly listKept = linkedSignal<ListSource, readonly AnalysisSummary[]>({
    source: () => ({
      tableId: this.tables.table()?.id ?? null,
      items: this.list.hasValue() ? this.list.value() : null,
    }),
    computation: (now, before) =>
      now.items ?? (before && before.source.tableId === now.tableId ? before.value : []),
  });

  /** The analysis shown: run in this session, or an earlier one opened again. */
  readonly analysis = computed(() => this.shown().analysis);
  /** The server's refusal of the last analysis run, null when it ran or none was run. */
  readonly analyseError = computed(() => this.shown().error);
  /** The table's analyses, newest first (summaries). */
  readonly analyses = this.listKept.asReadonly();
  /**
   * The VE of the analysis's base revision: the loaded head's values, or those of the older
   * revision an earlier analysis was run on (so a preview matches what the server applies).
   */
  readonly baseValues = computed(
    () => this.shown().openedBaseValues ?? this.tables.revision()?.values ?? [],
  );
  /**
   * The fuel-safety guard of the analysis shown, for the grid's smooth and fill gaps
   * (`TableStore.operate`); undefined without one (the core's default guard then).
   */
  readonly operationGuard = computed(
    (): LoadGuard | undefined => loadGuardOf(this.analysis()?.guard, true) ?? undefined,
  );

  /** The preview's evidence, taken once per analysis (what the worker needs, no more). */
  private readonly evidence = computed(() =>
    this.analysis()?.cells.map((row) =>
      row.map(({ weight, ratio, spread }) => ({ weight, ratio, spread })),
    ),
  );
  /** What the preview is computed from; null with no analysis or no valid options. */
  private readonly previewInput = computed((): PreviewInput | null => {
    const analysis = this.analysis();
    const cells = this.evidence();
    const table = this.tables.table();
    const options = this.applyOptions();
    const baseValues = this.baseValues();
    if (!analysis || !cells || !table || !options || baseValues.length === 0) return null;
    // The selection only matters for "only the selected cells": selecting in the grid while
    // applying to all cells must not start a new preview.
    const selected = options.scope === 'selected' ? this.tables.selectedCells() : [];
    const body = toApplyBody(options, selected, this.tables.lockedCells());
    return {
      rpmAxis: table.rpmAxis,
      mapAxisKpa: table.mapAxisKpa,
      baseValues,
      cells,
      settings: previewSettingsOf(analysis),
      apply: {
        stepFraction: body.stepFraction,
        smooth: body.smooth,
        fill: body.fill,
        maxReach: body.maxReach,
        lockedCells: body.lockedCells,
        onlyCells: body.onlyCells,
        guard: body.guard,
      },
    };
  });

  /**
   * The live preview of applying the analysis shown with the panel's options: what the apply
   * would write and how each cell got there (measured, filled, held). Null with no analysis, and
   * until the first preview of a newly shown analysis arrives (never one of an earlier analysis).
   */
  readonly preview = computed((): PreviewResult | null => {
    const cells = this.evidence();
    const result = this.previewer.result();
    return cells && result && this.previewer.resultFor()?.cells === cells ? result : null;
  });
  /** Why the latest preview could not be computed, or null. */
  readonly previewError = this.previewer.error;
  /** Whether a preview is on its way. */
  readonly isPreviewing = this.previewer.isComputing;

  constructor() {
    // Sync outward: every change of the analysis, options, selection or locks asks the worker.
    effect(() => {
      const input = this.previewInput();
      untracked(() => this.previewer.request(input));
    });
  }

  /** Takes the panel's apply options (null while one is out of range): the preview follows. */
  setApplyOptions(options: ApplyValue | null): void {
    this.applyOptions.set(options);
  }

  /** Runs an analysis of the chosen logs with the chosen settings against the loaded revision. */
  analyse(request: AnalyseRequest): void {
    const table = this.tables.table();
    const base = this.tables.revision();
    if (!table || !base || request.logIds.length === 0 || this.tables.busy()) return;
    this.shown.update((shown) => ({ ...shown, error: null }));
    const body = {
      baseRevisionId: base.id,
      logIds: [...request.logIds],
      settings: request.settings,
    };
    this.tables.perform(
      'analysing',
      this.analysesApi.run(table.id, body),
      'The analysis failed.',
      (analysis) => {
        this.shown.set({ analysis, openedBaseValues: null, error: null });
        this.list.reload();
      },
      (message) => this.shown.update((shown) => ({ ...shown, error: message })),
    );
  }

  /** Shows an earlier analysis of this table again (its overlays, plots and apply). */
  openAnalysis(analysisId: string): void {
    if (this.tables.busy()) return;
    const head = this.tables.revision();
    const request = this.analysesApi
      .get(analysisId)
      .pipe(
        switchMap((analysis) =>
          analysis.baseRevisionId === head?.id
            ? of({ analysis, base: head })
            : this.tablesApi
                .revision(analysis.baseRevisionId)
                .pipe(map((base) => ({ analysis, base }))),
        ),
      );
    this.tables.perform(
      'analysing',
      request,
      'The analysis could not be loaded.',
      ({ analysis, base }) => {
        const openedBaseValues = base.id === head?.id ? null : base.values;
        this.shown.update((shown) => ({ ...shown, analysis, openedBaseValues }));
      },
    );
  }

  /** Applies the analysis shown with the panel's options as a new draft revision, then reloads. */
  apply(body: ApplyAnalysisRequest): void {
    const analysis = this.analysis();
    if (!this.tables.table() || !analysis || this.tables.busy()) return;
    this.tables.perform(
      'applying',
      this.analysesApi.apply(analysis.id, body),
      'Applying failed.',
      (revision) =>
        this.tables.showNewRevision(revision, `Applied as draft revision ${revision.number}.`),
    );
  }

  /**
   * Applies on top of the grid's unsaved edits: saves them as a draft revision on the head, runs
   * the analysis shown again (same logs, same settings) against that revision, and applies the
   * new analysis with `body`. Locked cells thus keep the values the grid shows. When the save
   * went through and a later step fails, the saved revision loads and the failure says the edits
   * are kept in it: they are never dropped.
   */
  applyOnEdits(body: ApplyAnalysisRequest): void {
    const table = this.tables.table();
    const head = this.tables.revision();
    const analysis = this.analysis();
    if (!table || !head || !analysis || this.tables.busy()) return;
    let saved: Revision | null = null;
    const values = this.tables.values().map((row) => [...row]);
    const save = { parentId: head.id, values, message: EDITS_BEFORE_APPLY_MESSAGE };
    const request = this.tablesApi.createRevision(table.id, save).pipe(
      switchMap((edits) => {
        const run = { baseRevisionId: edits.id, logIds: [...analysis.logIds] };
        return this.analysesApi.run(table.id, { ...run, settings: analysis.settings }).pipe(
          switchMap((rerun) => this.analysesApi.apply(rerun.id, body)),
          map((applied) => ({ edits, applied })),
          catchError((error: unknown) => {
            saved = edits;
            const why = apiErrorMessage(error, 'the server did not answer.');
            const text = `Your edits are saved as revision ${edits.number}; applying on top of them failed: ${why}`;
            return throwError(() => new Error(text));
          }),
        );
      }),
    );
    this.tables.perform(
      'applying',
      request,
      'Saving the edits failed; nothing was applied.',
      ({ edits, applied }) =>
        this.tables.showNewRevision(
          applied,
          `Saved your edits as revision ${edits.number} and applied on top of them as draft ` +
            `revision ${applied.number}.`,
        ),
      () => {
        if (saved) this.tables.load(saved.tableId);
      },
    );
  }
}
