import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import {
  ChangeDetectionStrategy,
  Component,
  NO_ERRORS_SCHEMA,
  type WritableSignal,
  input,
  output,
  signal,
} from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { By } from '@angular/platform-browser';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/contracts/roles';
import { noAnimations } from '../../../testing/harness-helpers';
import {
  ASSUMED_GUARD,
  answerAnalysesList,
  answerTableLoad,
  revisionFixture,
  tableFixture,
} from '../../../testing/table-fixtures';
import type { AnalysisResource, AnalysisSummary } from '../../core/api/analyses-api';
import { Session } from '../../core/auth/session';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { AnalysisPanel } from './analysis/analysis-panel';
import type { AnalyseRequest, ApplyRequest } from './analysis/analysis-requests';
import { AnalysisStore, EDITS_BEFORE_APPLY_MESSAGE } from './analysis/analysis-store';
import { TableGrid } from './grid/table-grid';
import { PREVIEW_DEBOUNCE_MS } from './preview/proposal-preview';
import { TableStore } from './table-store';
import { TableWorkspace } from './table-workspace';

/** Stands in for the analysis panel (it has its own spec): it only sends what a click would. */
@Component({
  selector: 'app-analysis-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '',
})
class PanelStandIn {
  readonly busy = input<unknown>(null);
  readonly analyse = output<AnalyseRequest>();
  readonly apply = output<ApplyRequest>();
}

// A 2 × 3 table: rows are MAP breakpoints, columns RPM breakpoints.
const VALUES = [
  [40, 42, 44],
  [50, 52, 54],
];
const TABLE = tableFixture([1000, 2000, 3000], [30, 60]);
const R1 = revisionFixture(VALUES);

/** Revision `id` number `number` holding `values`, the table's head. */
function revision(id: string, number: number, values: number[][]) {
  return { ...R1, id, number, values };
}

const ANALYSIS: AnalysisResource = {
  id: 'a1',
  tableId: 't1',
  baseRevisionId: 'r1',
  logIds: ['l1', 'l2'],
  settings: { minWeight: 2, maxStepPercent: 10 },
  cells: [],
  proposal: [],
  filterReport: { logs: [] },
  leanFlags: [],
  guard: ASSUMED_GUARD,
  createdAt: '2026-01-01T00:00:00Z',
};

const BODY = { stepFraction: 0.5, lockedCells: [[0, 1]] as [number, number][], message: 'Round 2' };

/**
 * jsdom has no IntersectionObserver; the plots wait under `@defer (on viewport)`. This one never
 * reports, so they stay on their placeholder (they are not read here).
 */
class QuietIntersectionObserver {
  observe(): void {}
  unobserve(): void {}
  disconnect(): void {}
  takeRecords(): [] {
    return [];
  }
}

describe('TableWorkspace with unsaved edits and read-only roles', () => {
  const hadObserver = 'IntersectionObserver' in globalThis;
  beforeAll(() => {
    if (!hadObserver) {
      Object.assign(globalThis, { IntersectionObserver: QuietIntersectionObserver });
    }
  });
  afterAll(() => {
    if (!hadObserver) Reflect.deleteProperty(globalThis, 'IntersectionObserver');
  });

  let fixture: ComponentFixture<TableWorkspace>;
  let http: HttpTestingController;
  let store: TableStore;
  let analysis: AnalysisStore;
  let dialogs: HarnessLoader;
  const roles: WritableSignal<{ roles: Role[] }> = signal({ roles: ['tuner'] });

  const host = () => fixture.nativeElement as HTMLElement;

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();
    await fixture.whenStable();
  }

  /** Answers the analyses list read that follows every head revision loaded. */
  async function answerList(items: readonly { id: string }[] = []): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    TestBed.tick();
    answerAnalysesList(http, 't1', items);
    await settle();
  }

  async function open(userRoles: Role[], earlier: readonly AnalysisSummary[] = []): Promise<void> {
    roles.set({ roles: userRoles });
    fixture = TestBed.createComponent(TableWorkspace);
    fixture.componentRef.setInput('id', 't1');
    dialogs = TestbedHarnessEnvironment.documentRootLoader(fixture);
    fixture.detectChanges();
    answerTableLoad(http, TABLE, R1);
    await answerList(earlier);
    store = fixture.debugElement.injector.get(TableStore);
    analysis = fixture.debugElement.injector.get(AnalysisStore);
  }

  /** Runs the analysis shown, as the panel would. */
  async function showAnalysis(): Promise<void> {
    analysis.analyse({ logIds: ANALYSIS.logIds, settings: ANALYSIS.settings });
    http.expectOne({ method: 'POST', url: '/api/tables/t1/analyses' }).flush(ANALYSIS);
    await answerList();
  }

  /** Presses "Apply as draft" in the (stand-in) panel. */
  async function pressApply(): Promise<void> {
    const panel = fixture.debugElement.query(By.directive(PanelStandIn));
    (panel.componentInstance as PanelStandIn).apply.emit({ body: BODY });
    await settle();
  }

  /** Clicks the button of the open dialog whose text matches `text`. */
  async function choose(text: RegExp): Promise<void> {
    const dialog = await dialogs.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text }))).click();
    await settle();
  }

  /** Whether a `beforeunload` now would make the browser ask. */
  function unloadAsks(): boolean {
    const event = new Event('beforeunload', { cancelable: true });
    window.dispatchEvent(event);
    return event.defaultPrevented;
  }

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        noAnimations,
        { provide: PREVIEW_DEBOUNCE_MS, useValue: 0 },
        { provide: Session, useValue: { user: roles } },
        {
          provide: DisplayPreferences,
          useValue: { units: signal('metric'), mixture: signal('lambda') },
        },
      ],
    });
    TestBed.overrideComponent(TableWorkspace, {
      remove: { imports: [AnalysisPanel] },
      add: { imports: [PanelStandIn], schemas: [NO_ERRORS_SCHEMA] },
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  describe('applying', () => {
    beforeEach(async () => {
      await open(['tuner']);
      await showAnalysis();
    });

    it('When the grid has no unsaved edits, then Apply sends the apply at once without asking', async () => {
      await pressApply();

      expect(await dialogs.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
      const request = http.expectOne({ method: 'POST', url: '/api/analyses/a1/apply' });
      expect(request.request.body).toEqual(BODY);
      request.flush(revision('r2', 2, VALUES));
      answerTableLoad(http, { ...TABLE, headRevisionId: 'r2' }, revision('r2', 2, VALUES));
      await answerList();
      expect(store.revision()?.number).toBe(2);
    });

    it('When the grid has edits and the user cancels, then nothing is sent and the edits stay', async () => {
      expect(store.edit(1, 2, '60')).toBeNull();
      await pressApply();
      const dialog = await dialogs.getHarness(MatDialogHarness);
      expect(await dialog.getText()).toContain('1 cell of the grid is edited but not saved');

      await choose(/^Cancel$/);

      http.expectNone({ method: 'POST' });
      expect(store.values()[1][2]).toBe(60);
      expect(store.isDirty()).toBe(true);
    });

    it('When the user discards the edits, then the analysed revision is applied and undo says why it is empty', async () => {
      expect(store.edit(1, 2, '60')).toBeNull();
      await pressApply();
      await choose(/^Discard the edits and apply to revision 1$/);

      const request = http.expectOne({ method: 'POST', url: '/api/analyses/a1/apply' });
      expect(request.request.body).toEqual(BODY);
      const applied = revision('r2', 2, [
        [41, 42, 44],
        [50, 52, 54],
      ]);
      request.flush(applied);
      answerTableLoad(http, { ...TABLE, headRevisionId: 'r2' }, applied);
      await answerList();

      expect(store.values()).toEqual(applied.values);
      expect(store.isDirty()).toBe(false);
      expect(store.historyLabels().undo).toBe(
        'Undo (no edits yet on revision 2; earlier revisions stay saved)',
      );
    });

    it('When the user saves first, then the edits (locked ones too) are saved, re-analysed with the same logs and settings, and applied on top', async () => {
      expect(store.edit(0, 1, '47')).toBeNull();
      store.select({ anchor: { row: 0, col: 1 }, focus: { row: 0, col: 1 } });
      store.setLocked(true);
      await pressApply();
      const dialog = await dialogs.getHarness(MatDialogHarness);
      expect(await dialog.getText()).toContain('1 cell locked shows an edited value');

      await choose(/^Save your edits as a draft first, then apply on top of them$/);

      const save = http.expectOne({ method: 'POST', url: '/api/tables/t1/revisions' });
      const edited = [
        [40, 47, 44],
        [50, 52, 54],
      ];
      expect(save.request.body).toEqual({
        parentId: 'r1',
        values: edited,
        message: EDITS_BEFORE_APPLY_MESSAGE,
      });
      save.flush(revision('r2', 2, edited));
      const run = http.expectOne({ method: 'POST', url: '/api/tables/t1/analyses' });
      expect(run.request.body).toEqual({
        baseRevisionId: 'r2',
        logIds: ['l1', 'l2'],
        settings: { minWeight: 2, maxStepPercent: 10 },
      });
      run.flush({ ...ANALYSIS, id: 'a2', baseRevisionId: 'r2' });
      const apply = http.expectOne({ method: 'POST', url: '/api/analyses/a2/apply' });
      expect(apply.request.body).toEqual(BODY);
      // The server keeps the locked cell at its base value: the 47 the grid showed.
      const applied = revision('r3', 3, [
        [41, 47, 45],
        [51, 52, 54],
      ]);
      apply.flush(applied);
      answerTableLoad(http, { ...TABLE, headRevisionId: 'r3' }, applied);
      await answerList();

      expect(store.revision()?.id).toBe('r3');
      expect(store.values()[0][1]).toBe(47);
      expect(document.body.textContent).toContain(
        'Saved your edits as revision 2 and applied on top of them as draft revision 3.',
      );
    });

    it('When the run after the save fails, then the saved revision loads and the failure says the edits are kept', async () => {
      expect(store.edit(1, 0, '55')).toBeNull();
      await pressApply();
      await choose(/^Save your edits/);

      const edited = [
        [40, 42, 44],
        [55, 52, 54],
      ];
      http
        .expectOne({ method: 'POST', url: '/api/tables/t1/revisions' })
        .flush(revision('r2', 2, edited));
      http
        .expectOne({ method: 'POST', url: '/api/tables/t1/analyses' })
        .flush(
          { error: { code: 'gone', message: 'A log of this analysis is gone.' } },
          { status: 409, statusText: 'Conflict' },
        );
      http.expectNone((r) => r.method === 'POST' && r.url.endsWith('/apply'));
      answerTableLoad(http, { ...TABLE, headRevisionId: 'r2' }, revision('r2', 2, edited));
      await answerList();

      expect(store.values()).toEqual(edited);
      expect(store.isDirty()).toBe(false);
      expect(document.body.textContent).toContain(
        'Your edits are saved as revision 2; applying on top of them failed',
      );
    });
  });

  describe('closing the tab', () => {
    it('When there are unsaved edits, then the browser asks; once they are gone or the page is, it does not', async () => {
      await open(['tuner']);
      expect(unloadAsks()).toBe(false);

      expect(store.edit(0, 0, '41')).toBeNull();
      TestBed.tick();
      expect(unloadAsks()).toBe(true);

      store.undo();
      TestBed.tick();
      expect(unloadAsks()).toBe(false);

      expect(store.edit(0, 0, '41')).toBeNull();
      TestBed.tick();
      expect(unloadAsks()).toBe(true);
      expect(fixture.componentInstance.unsavedCellCount()).toBe(1);

      fixture.destroy();
      expect(unloadAsks()).toBe(false);
    });
  });

  describe('an operator', () => {
    it('When an operator opens a table, then it reads: no editing, saving, running or applying, with the reason', async () => {
      await open(['operator']);

      expect(host().querySelector('[data-testid="read-only-note"]')?.textContent).toContain(
        'Editing cells, saving, running an analysis and applying one are for tuners.',
      );
      expect(host().querySelector('app-analysis-panel')).toBeNull();
      expect(host().querySelector('app-cell-ops-bar')).toBeNull();
      expect(host().querySelector('form.save')).toBeNull();
      expect(host().querySelector('[aria-label^="Undo"]')).toBeNull();
      const grid = fixture.debugElement.query(By.directive(TableGrid));
      expect((grid.componentInstance as TableGrid).editable()).toBe(false);
      // A shortcut does nothing either.
      store.edit(0, 0, '41');
      host().dispatchEvent(new KeyboardEvent('keydown', { key: 'z', ctrlKey: true }));
      expect(store.values()[0][0]).toBe(41);
    });

    it('When the table has analyses, then an operator opens one and reads its coverage and lean flags', async () => {
      const summary: AnalysisSummary = {
        id: 'a1',
        tableId: 't1',
        baseRevisionId: 'r1',
        baseRevisionNumber: 1,
        logIds: ['l1', 'l2'],
        settings: {},
        createdAt: '2026-01-01T00:00:00Z',
        trustedCells: 4,
        leanFlagCount: 1,
        authorName: 'Demo Tuner',
      };
      await open(['operator'], [summary]);
      expect(host().querySelector('app-analysis-history')).not.toBeNull();
      const coverage = await TestbedHarnessEnvironment.loader(fixture).getHarness(
        MatButtonToggleHarness.with({ text: 'Coverage' }),
      );
      expect(await coverage.isDisabled()).toBe(true);

      analysis.openAnalysis('a1');
      const flag = {
        row: 1,
        col: 2,
        rpm: 3000,
        mapKpa: 60,
        leanPercent: 6,
        worstLeanPercent: 9,
        weight: 30,
        severity: 'warn' as const,
      };
      http.expectOne('/api/analyses/a1').flush({ ...ANALYSIS, leanFlags: [flag] });
      await settle();

      expect(await coverage.isDisabled()).toBe(false);
      await coverage.check();
      expect(host().querySelector('app-lean-banner')?.textContent).toContain('3000 rpm × 60 kPa');
      expect(host().querySelector('app-analysis-panel')).toBeNull();
    });
  });
});
