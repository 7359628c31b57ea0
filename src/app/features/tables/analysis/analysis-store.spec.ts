import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { ApplyAnalysisRequest } from '@shared/contracts/analyses';
import {
  answerAnalysesList,
  answerTableLoad,
  leanRichAnalysis,
  revisionFixture,
  SMALL_TABLE,
  tableFixture,
} from '../../../../testing/table-fixtures';
import { type ApplyValue, defaultApplyValue } from './analysis-apply-model';
import { AnalysisStore } from './analysis-store';
import { PREVIEW_DEBOUNCE_MS, ProposalPreview } from '../preview/proposal-preview';
import { computeProposalPreview } from '../preview/proposal-preview-compute';
import { TableStore } from '../table-store';

const TABLE = tableFixture(SMALL_TABLE.rpmAxis, SMALL_TABLE.mapAxisKpa);
const REVISION = revisionFixture(SMALL_TABLE.values);

/** The apply options a new analysis starts with, changed by `change`. */
function options(change: Partial<ApplyValue> = {}): ApplyValue {
  return { ...defaultApplyValue({ stepFraction: 0.5 }), ...change };
}

describe('AnalysisStore', () => {
  let tables: TableStore;
  let store: AnalysisStore;
  let http: HttpTestingController;
  let snack: jest.Mock;

  /** Lets the effects run: the list's read, the preview's request and its answer. */
  async function settle(): Promise<void> {
    for (let round = 0; round < 3; round++) {
      TestBed.tick();
      await new Promise((resolve) => setTimeout(resolve, 5));
    }
    TestBed.tick();
  }

  /** Runs an analysis answered with `analysis` (the list is read again, empty). */
  async function run(analysis = leanRichAnalysis()): Promise<void> {
    store.analyse({ logIds: ['log-1'], settings: {} });
    http
      .expectOne((r) => r.method === 'POST' && r.url === '/api/tables/t1/analyses')
      .flush(analysis);
    await settle();
    answerAnalysesList(http);
  }

  beforeEach(async () => {
    localStorage.clear();
    snack = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        TableStore,
        AnalysisStore,
        ProposalPreview,
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: { open: snack } },
        { provide: PREVIEW_DEBOUNCE_MS, useValue: 0 },
      ],
    });
    tables = TestBed.inject(TableStore);
    store = TestBed.inject(AnalysisStore);
    http = TestBed.inject(HttpTestingController);
    tables.load('t1');
    answerTableLoad(http, TABLE, REVISION);
    await settle();
    answerAnalysesList(http, 't1', [{ id: 'a0' }]);
    await settle();
  });

  afterEach(() => http.verify());

  it('When the table loads, then its earlier analyses are read and none is shown', () => {
    expect(store.analyses().map((a) => a.id)).toEqual(['a0']);
    expect([store.analysis(), store.preview(), store.analyseError()]).toEqual([null, null, null]);
    expect(store.baseValues()).toEqual(SMALL_TABLE.values);
  });

  it('When an analysis runs, then its settings are sent and the list of analyses is read again', async () => {
    store.analyse({ logIds: ['log-1'], settings: { stepFraction: 0.7 } });
    expect(tables.busy()).toBe('analysing');
    const post = http.expectOne((r) => r.method === 'POST' && r.url === '/api/tables/t1/analyses');
    expect(post.request.body).toEqual({
      baseRevisionId: 'r1',
      logIds: ['log-1'],
      settings: { stepFraction: 0.7 },
    });
    post.flush(leanRichAnalysis());
    await settle();
    answerAnalysesList(http, 't1', [{ id: 'an-1' }, { id: 'a0' }]);
    await settle();
    expect(tables.busy()).toBeNull();
    expect(store.analysis()?.id).toBe('an-1');
    expect(store.analyses().map((a) => a.id)).toEqual(['an-1', 'a0']);
  });

  it('When the server refuses a run, then its sentence is kept and told, and the list stays', async () => {
    store.analyse({ logIds: ['log-1'], settings: {} });
    http
      .expectOne((r) => r.method === 'POST' && r.url === '/api/tables/t1/analyses')
      .flush(
        { error: { code: 'invalid_settings', message: 'expression "rpm >": cannot be read' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await settle();
    expect(store.analyseError()).toBe('expression "rpm >": cannot be read');
    expect(snack).toHaveBeenCalledWith('expression "rpm >": cannot be read', 'Dismiss', {
      duration: 8000,
    });
    expect(store.analyses().map((a) => a.id)).toEqual(['a0']);
    expect(tables.busy()).toBeNull();
  });

  it('When an earlier analysis of an older revision is opened, then that revision is its base', async () => {
    store.openAnalysis('a0');
    http.expectOne('/api/analyses/a0').flush({ ...leanRichAnalysis(), baseRevisionId: 'r0' });
    http.expectOne('/api/revisions/r0').flush({
      ...REVISION,
      id: 'r0',
      values: SMALL_TABLE.values.map((row) => row.map((v) => v - 1)),
    });
    await settle();
    expect(store.analysis()?.baseRevisionId).toBe('r0');
    expect(store.baseValues()[0]).toEqual([39, 44, 49, 47]);
  });

  it('When the apply options come, then the preview equals the server’s apply with the locks', async () => {
    await run();
    expect(store.preview()).toBeNull();
    tables.select({ anchor: { row: 0, col: 0 }, focus: { row: 0, col: 0 } });
    tables.setLocked(true);
    store.setApplyOptions(options({ stepFraction: 0.9 }));
    await settle();

    const expected = computeProposalPreview({
      ...SMALL_TABLE,
      baseValues: SMALL_TABLE.values,
      cells: leanRichAnalysis().cells,
      // The analysis's own trust and step limits and its guard, as the server's apply reads them.
      settings: {
        minWeight: 10,
        maxStepPercent: 6,
        guard: { loadLineKpa: 91.19, leanAllowancePercent: 1 },
      },
      apply: { stepFraction: 0.9, smooth: 0.3, fill: true, lockedCells: [[0, 0]], guard: true },
    });
    expect(store.preview()).toEqual(expected);
    expect(store.preview()?.origin[0]?.[0]).toBe('locked');
    // The hole under load is held at its base value.
    expect(store.preview()?.origin[2]?.[3]).toBe('held');
    expect(store.preview()?.values[2]?.[3]).toBe(92);
  });

  it('When the guard is turned off, then the preview holds nothing and may lean the hole', async () => {
    await run();
    store.setApplyOptions(options({ guard: false }));
    await settle();
    expect(store.preview()?.guard).toBeNull();
    expect(store.preview()?.heldCount).toBe(0);
    expect(store.preview()?.values[2]?.[3]).toBeLessThan(92);
  });

  it('When options are out of range, then there is no preview', async () => {
    await run();
    store.setApplyOptions(options());
    await settle();
    expect(store.preview()).not.toBeNull();
    store.setApplyOptions(null);
    await settle();
    expect(store.preview()).toBeNull();
  });

  it('When another analysis is shown, then the old preview goes until its own arrives', async () => {
    await run();
    store.setApplyOptions(options());
    await settle();
    const first = store.preview();
    expect(first).not.toBeNull();

    store.analyse({ logIds: ['log-1'], settings: {} });
    http
      .expectOne((r) => r.method === 'POST' && r.url === '/api/tables/t1/analyses')
      .flush({ ...leanRichAnalysis(), id: 'an-2' });
    // Shown at once, before any effect ran: no preview of the analysis before it.
    expect(store.analysis()?.id).toBe('an-2');
    expect(store.preview()).toBeNull();
    await settle();
    answerAnalysesList(http);
    expect(store.preview()).toEqual(first);
  });

  it('When the analysis is applied, then the options go as they are and the reload clears it', async () => {
    await run();
    store.setApplyOptions(options());
    await settle();
    const body: ApplyAnalysisRequest = {
      stepFraction: 0.8,
      smooth: 0,
      onlyCells: [[1, 1]],
      lockedCells: [[0, 0]],
      guard: false,
    };
    store.apply(body);
    expect(tables.busy()).toBe('applying');
    const apply = http.expectOne('/api/analyses/an-1/apply');
    expect(apply.request.body).toEqual(body);
    apply.flush({ ...REVISION, id: 'r2', number: 2 });
    expect(snack).toHaveBeenCalledWith('Applied as draft revision 2.', 'OK', { duration: 6000 });

    answerTableLoad(http, { ...TABLE, headRevisionId: 'r2' }, { ...REVISION, id: 'r2' });
    expect([store.analysis(), store.preview()]).toEqual([null, null]);
    // A new head: the list is read again.
    await settle();
    answerAnalysesList(http, 't1', [{ id: 'an-1' }]);
    await settle();
    expect(store.analyses().map((a) => a.id)).toEqual(['an-1']);
  });

  it('When an analysis with its own load line is shown, then operations run under it', async () => {
    // 100 kPa × 3000 rpm (95) from its neighbours: a fill would lean it by about 3 %.
    tables.select({ anchor: { row: 2, col: 2 }, focus: { row: 2, col: 2 } });
    expect(store.operationGuard()).toBeUndefined();
    expect(tables.operate({ kind: 'fillGaps' }, store.operationGuard())).toContain(
      'Fill gaps changed no cell. Fuel-safety guard: 1 cell under load kept its value',
    );

    await run({ ...leanRichAnalysis(), guard: { ...leanRichAnalysis().guard, loadLineKpa: 130 } });
    expect(store.operationGuard()).toEqual({ loadLineKpa: 130, leanAllowance: 0.01 });
    expect(tables.operate({ kind: 'fillGaps' }, store.operationGuard())).toBeNull();
    expect(tables.values()[2][2]).toBeLessThan(95);
  });
});
