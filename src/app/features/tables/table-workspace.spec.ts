import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { NO_ERRORS_SCHEMA, signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { provideRouter } from '@angular/router';
import { noAnimations } from '../../../testing/harness-helpers';
import type { AnalysisCell, AnalysisResource } from '../../core/api/analyses-api';
import { Session } from '../../core/auth/session';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { defaultApplyValue } from './analysis/analysis-apply-model';
import { AnalysisPanel } from './analysis/analysis-panel';
import { AnalysisStore } from './analysis/analysis-store';
import { TableStore } from './table-store';
import { TableWorkspace } from './table-workspace';
import {
  ASSUMED_GUARD,
  answerAnalysesList,
  answerTableLoad,
  revisionFixture,
  tableFixture,
} from '../../../testing/table-fixtures';
import { PREVIEW_DEBOUNCE_MS, PREVIEW_WORKER_FACTORY } from './preview/proposal-preview';
import type {
  PreviewResult,
  PreviewWorkerReply,
  PreviewWorkerRequest,
} from './preview/proposal-preview-compute';

// A 4 × 5 table: rows are MAP breakpoints, columns RPM breakpoints.
const VALUES = [
  [40, 42, 44, 46, 48],
  [50, 52, 54, 56, 58],
  [60, 62, 64, 66, 68],
  [70, 72, 74, 76, 78],
];
const TABLE = tableFixture([1000, 2000, 3000, 4000, 5000], [30, 60, 90, 120]);
const REVISION = revisionFixture(VALUES);

function analysisCell(lambdaErrorPct: number | null): AnalysisCell {
  return {
    samples: lambdaErrorPct === null ? 0 : 8,
    weight: lambdaErrorPct === null ? 0 : 3.5,
    ratio: null,
    spread: lambdaErrorPct === null ? null : 0.021,
    effectiveCount: 0,
    lambdaErrorPct,
    worstLeanPct: null,
    lambdaMeasured: null,
    lambdaCommanded: null,
    proposal: null,
    changePct: null,
    status: lambdaErrorPct === null ? 'no_data' : 'trusted',
  };
}

// Lean (+4.2 %) at the top-left cell, rich (−3.1 %) beside it, no data elsewhere.
const ANALYSIS: AnalysisResource = {
  id: 'a1',
  tableId: 't1',
  baseRevisionId: 'r1',
  logIds: ['l1'],
  settings: {},
  cells: VALUES.map((row, r) =>
    row.map((_, c) => analysisCell(r === 0 && c === 0 ? 4.24 : r === 0 && c === 1 ? -3.06 : null)),
  ),
  proposal: VALUES.map((row) => row.map(() => null)),
  filterReport: { logs: [] },
  leanFlags: [],
  guard: ASSUMED_GUARD,
  createdAt: '2026-01-01T00:00:00Z',
};

/**
 * What applying would write: the top-left cell measured (+5 %), the 120 kPa row held at 5000
 * rpm and filled leaner at 1000 rpm within the allowance, the rest unchanged.
 */
const PREVIEW: PreviewResult = {
  values: VALUES.map((row, r) =>
    row.map((v, c) => (r === 0 && c === 0 ? 42 : r === 3 && c === 0 ? 69.5 : v)),
  ),
  origin: VALUES.map((row, r) =>
    row.map((_, c) =>
      r === 0 && c === 0
        ? 'measured'
        : r === 3 && c === 4
          ? 'held'
          : r === 3 && c === 0
            ? 'filled'
            : 'unchanged',
    ),
  ),
  heldCount: 1,
  guard: { loadLineKpa: 91.19, leanAllowance: 0.01 },
};

/**
 * The preview's worker, standing in for the real one (whose figures `proposal-preview-compute`
 * checks against the server): it keeps each request and answers the newest when told.
 */
class PreviewWorkerStandIn {
  readonly sent: PreviewWorkerRequest[] = [];
  onmessage: ((event: MessageEvent<PreviewWorkerReply>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;

  postMessage(request: PreviewWorkerRequest): void {
    this.sent.push(request);
  }

  terminate(): void {
    this.onmessage = null;
  }

  /** Answers the newest request with `result`. */
  answer(result: PreviewResult): void {
    const id = this.sent.at(-1)?.id ?? 0;
    this.onmessage?.({ data: { id, ...result } } as MessageEvent<PreviewWorkerReply>);
  }
}

describe('TableWorkspace', () => {
  let fixture: ComponentFixture<TableWorkspace>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let store: TableStore;
  let analysis: AnalysisStore;
  let worker: PreviewWorkerStandIn;

  const host = () => fixture.nativeElement as HTMLElement;
  const cellEl = (row: number, col: number) =>
    host().querySelector<HTMLElement>(`.ag-row[row-index="${row}"] .ag-cell[col-id="c${col}"]`);
  const cellText = (row: number, col: number) => cellEl(row, col)?.textContent?.trim() ?? '';

  /** Lets the grid deliver its events (it batches them into a timeout) and the page update. */
  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    fixture.detectChanges();
    await fixture.whenStable();
  }

  /**
   * Answers the analysis store's read of the table's analyses (none): it starts once the effects
   * run, and the page is not stable while it waits.
   */
  async function answerList(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    TestBed.tick();
    answerAnalysesList(http);
    await settle();
  }

  /**
   * Lets new views reach the cells: the page hands the grid new rows, the grid takes them in a
   * timeout of its own and then repaints every cell (marks can change without values).
   */
  async function settleRows(): Promise<void> {
    await settle();
    await settle();
  }

  /** Drags from one cell to another as a mouse would: press, move over the cells, release. */
  async function drag(from: [number, number], to: [number, number]): Promise<void> {
    const start = cellEl(...from);
    const end = cellEl(...to);
    if (!start || !end) throw new Error('drag: a cell is not rendered');
    // The grid listens for pointerdown where the browser has it (jsdom does).
    start.dispatchEvent(new MouseEvent('pointerdown', { bubbles: true, button: 0, buttons: 1 }));
    end.dispatchEvent(
      new MouseEvent('mouseover', { bubbles: true, buttons: 1, relatedTarget: start }),
    );
    document.dispatchEvent(new MouseEvent('mouseup', { bubbles: true }));
    await settle();
  }

  /** The user's unit system, as the preferences would give it. */
  const units = signal<'metric' | 'imperial'>('metric');

  beforeEach(async () => {
    units.set('metric');
    localStorage.clear();
    worker = new PreviewWorkerStandIn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        noAnimations,
        { provide: PREVIEW_DEBOUNCE_MS, useValue: 0 },
        {
          provide: PREVIEW_WORKER_FACTORY,
          useValue: () => Promise.resolve(worker as unknown as Worker),
        },
        {
          provide: Session,
          useValue: { user: signal({ id: 'u1', name: 'Demo Tuner', roles: ['tuner'] }) },
        },
        { provide: DisplayPreferences, useValue: { units, mixture: signal('lambda') } },
      ],
    });
    // The analysis panel has its own spec; here it is an inert element, so the grid is tested alone.
    TestBed.overrideComponent(TableWorkspace, {
      remove: { imports: [AnalysisPanel] },
      add: { schemas: [NO_ERRORS_SCHEMA] },
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(TableWorkspace);
    fixture.componentRef.setInput('id', 't1');
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    answerTableLoad(http, TABLE, REVISION);
    await answerList();
    store = fixture.debugElement.injector.get(TableStore);
    analysis = fixture.debugElement.injector.get(AnalysisStore);
  });

  afterEach(() => http.verify());

  it('When the overlay switches to lambda error, then the legend and cells show signed errors', async () => {
    expect(cellText(0, 0)).toBe('40.0');
    expect(host().querySelector('app-colour-legend')?.textContent).toContain('VE %');

    analysis.analyse({ logIds: ['l1'], settings: {} });
    http
      .expectOne((r) => r.method === 'POST' && r.url === '/api/tables/t1/analyses')
      .flush(ANALYSIS);
    await answerList();
    const toggle = await loader.getHarness(MatButtonToggleHarness.with({ text: 'Lambda error %' }));
    await toggle.check();
    await settle();

    const legend = host().querySelector('app-colour-legend')?.textContent ?? '';
    expect(legend).toContain('▲ +10 % leaner');
    expect(legend).toContain('▼ −10 % richer');
    expect([cellText(0, 0), cellText(0, 1), cellText(0, 2)]).toEqual(['▲ +4.2', '▼ −3.1', '–']);

    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Spread' }))).check();
    await settle();
    expect(cellText(0, 0)).toBe('2.1');
    expect(host().querySelector('app-colour-legend')?.textContent).toContain('% spread');
  });

  /** Runs an analysis answered with `resource`. */
  async function showAnalysis(resource: AnalysisResource = ANALYSIS): Promise<void> {
    analysis.analyse({ logIds: ['l1'], settings: {} });
    http
      .expectOne((r) => r.method === 'POST' && r.url === '/api/tables/t1/analyses')
      .flush(resource);
    await answerList();
  }

  /**
   * Sends the apply options as the panel would (it is inert here), waits for the preview's
   * request to reach the worker, and answers it with `result`.
   */
  async function previewOf(result: PreviewResult): Promise<void> {
    analysis.setApplyOptions(defaultApplyValue());
    const before = worker.sent.length;
    for (let round = 0; round < 20 && worker.sent.length === before; round++) await settle();
    worker.answer(result);
    await settleRows();
  }

  it('When the preview holds a cell under load, then the grid marks it and the change view tells origins apart', async () => {
    await showAnalysis();
    await previewOf(PREVIEW);
    // On the VE view already: the hand-and-dots mark, with its words as the cell's title.
    expect(cellEl(3, 4)?.classList).toContain('cs-held');
    expect(cellEl(3, 4)?.getAttribute('title')).toMatch(/^Held under load, needs data/);
    expect(cellEl(3, 3)?.classList).not.toContain('cs-held');

    await (
      await loader.getHarness(MatButtonToggleHarness.with({ text: 'Change vs base %' }))
    ).check();
    await settle();
    // 42/40 → +5 %, 69.5/70 → −0.7 %: what the apply writes, filled cells slanted.
    expect([cellText(0, 0), cellText(3, 0), cellText(3, 4), cellText(1, 1)]).toEqual([
      '▲ +5.0',
      '▼ −0.7',
      '0.0',
      '0.0',
    ]);
    expect(cellEl(0, 0)?.classList).toContain('cs-measured');
    expect(cellEl(3, 0)?.classList).toContain('cs-filled');
    expect(cellEl(3, 0)?.getAttribute('title')).toMatch(/^Filled: a guess/);
    expect(cellEl(3, 4)?.classList).toContain('cs-held');
    expect(host().querySelector('[data-testid="legend-marks"]')?.textContent).toContain(
      'Hand mark on dots: held under load, needs data',
    );
  });

  it('When a new analysis arrives, then the old preview is dropped until its own comes', async () => {
    await showAnalysis();
    await previewOf(PREVIEW);
    expect(cellEl(3, 4)?.classList).toContain('cs-held');
    const asked = worker.sent.length;
    await showAnalysis({ ...ANALYSIS, id: 'a2' });
    await settleRows();
    expect(analysis.preview()).toBeNull();
    expect(cellEl(3, 4)?.classList).not.toContain('cs-held');
    // The new analysis's own preview was asked for; once it comes, its marks show.
    expect(worker.sent.length).toBeGreaterThan(asked);
    worker.answer(PREVIEW);
    await settleRows();
    expect(cellEl(3, 4)?.classList).toContain('cs-held');
  });

  it('When flags are loud and watched, then the banner shows them apart with their words', async () => {
    const flag = {
      row: 3,
      col: 1,
      rpm: 2000,
      mapKpa: 120,
      leanPercent: 7.2,
      worstLeanPercent: 12,
      weight: 30,
      severity: 'abort' as const,
    };
    await showAnalysis({
      ...ANALYSIS,
      leanFlags: [flag, { ...flag, col: 3, rpm: 4000, weight: 0.4, severity: 'watch' as const }],
    });
    const alert = host().querySelector('app-lean-banner [role="alert"]')?.textContent ?? '';
    expect(alert).toContain('Lean under load in 1 cell');
    expect(alert).toContain('2000 rpm × 120 kPa: 7.2 % lean on average, worst 12.0 % (stop)');
    expect(alert).toContain('“Stop”: stop loading the engine in that cell until it is richer.');
    expect(alert).not.toContain('4000 rpm');
    const quiet = host().querySelector('app-lean-banner [role="status"]')?.textContent ?? '';
    expect(quiet).toContain('1 cell looks lean but rests on too little data: log it again.');
    expect(quiet).toContain('4000 rpm × 120 kPa: 7.2 % lean on average, worst 12.0 % (watch)');
    expect(cellEl(3, 1)?.classList).toContain('cs-lean-flag');
    expect(cellEl(3, 3)?.classList).toContain('cs-lean-watch');
    expect(cellEl(3, 3)?.classList).not.toContain('cs-lean-flag');
  });

  it('When gaps are filled under load, then a cell the fill would lean keeps its value and the guard says so', async () => {
    // 120 kPa × 3000 rpm (74) from its neighbours 64, 72 and 76: about 70.7, 4 % leaner.
    store.select({ anchor: { row: 3, col: 2 }, focus: { row: 3, col: 2 } });
    expect(store.operate({ kind: 'fillGaps' })).toBe(
      'Fill gaps changed no cell. Fuel-safety guard: 1 cell under load kept its value — the ' +
        'operation would have made it more than 1 % leaner. Scale or set it to change it on purpose.',
    );
    expect(store.values()[3][2]).toBe(74);

    // Below the line (60 kPa) the same fill leans a cell: 60 back to 52 from 42, 50, 54, 62.
    expect(store.edit(1, 1, '60')).toBeNull();
    store.select({ anchor: { row: 1, col: 1 }, focus: { row: 1, col: 1 } });
    expect(store.operate({ kind: 'fillGaps' })).toBeNull();
    expect(store.values()[1][1]).toBe(52);

    // With an analysis whose line lies above the table, the page's fill under load runs too.
    await showAnalysis({ ...ANALYSIS, guard: { ...ASSUMED_GUARD, loadLineKpa: 130 } });
    store.select({ anchor: { row: 3, col: 2 }, focus: { row: 3, col: 2 } });
    await settle();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Fill gaps' }))).click();
    await settle();
    expect(store.values()[3][2]).toBeLessThan(74);
  });

  it('When cells are dragged over, then they are marked and the size is shown', async () => {
    await drag([1, 1], [2, 3]);
    expect(host().querySelector('[data-testid="selection-size"]')?.textContent?.trim()).toBe(
      '2 × 3 cells selected',
    );
    expect(store.selectedCells()).toEqual([
      [1, 1],
      [1, 2],
      [1, 3],
      [2, 1],
      [2, 2],
      [2, 3],
    ]);
    expect(cellEl(1, 1)?.classList).toContain('cs-selected');
    expect(cellEl(1, 1)?.classList).toContain('cs-sel-top');
    expect(cellEl(0, 0)?.classList).not.toContain('cs-selected');
  });

  it('When a selection is scaled, then exactly those cells change, and undo and redo take one step', async () => {
    await drag([1, 1], [2, 3]);
    await (
      await loader.getHarness(MatInputHarness.with({ selector: '[name="amount"]' }))
    ).setValue('10');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Scale %' }))).click();
    await settle();

    const scaled = VALUES.map((row, r) =>
      row.map((v, c) => (r >= 1 && r <= 2 && c >= 1 && c <= 3 ? Math.round(v * 110) / 100 : v)),
    );
    expect(store.values()).toEqual(scaled);
    expect(cellText(1, 1)).toBe('57.2');

    const undo = await loader.getHarness(
      MatButtonHarness.with({ selector: '[aria-label^="Undo"]' }),
    );
    expect(await (await undo.host()).getAttribute('aria-label')).toBe('Undo Scale +10 % (6 cells)');
    await undo.click();
    await settle();
    expect(store.values()).toEqual(VALUES);
    expect(cellText(1, 1)).toBe('52.0');

    const redo = await loader.getHarness(
      MatButtonHarness.with({ selector: '[aria-label^="Redo"]' }),
    );
    expect(await (await redo.host()).getAttribute('aria-label')).toBe('Redo Scale +10 % (6 cells)');
    await redo.click();
    await settle();
    expect(store.values()).toEqual(scaled);
  });

  it('When a cell is locked, then a blend and a paste over it leave it alone', async () => {
    await drag([0, 2], [0, 2]);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Lock$/ }))).click();
    await settle();
    expect(cellEl(0, 2)?.classList).toContain('cs-locked');
    expect(store.lockedCells()).toEqual([[0, 2]]);
    expect(JSON.parse(localStorage.getItem('cellsmith.locks.t1') ?? '[]')).toEqual([[0, 2]]);

    await drag([0, 0], [0, 4]);
    // Make the row uneven (the paste skips the locked cell), then blend it along the row.
    expect(store.paste('41\t40\t40\t40\t49')).toBe('Pasted 4 cells; 1 locked cell was skipped.');
    await settle();
    expect(store.values()[0]).toEqual([41, 40, 44, 40, 49]);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Blend across/ }))).click();
    await (await loader.getHarness(MatMenuHarness)).clickItem({ text: /Along rows/ });
    await settle();
    // Straight in RPM from 41 (1000 rpm) to 49 (5000 rpm): 43 at 2000, 47 at 4000; 44 is locked.
    expect(store.values()[0]).toEqual([41, 43, 44, 47, 49]);
    expect(store.historyLabels().undo).toBe('Undo Blend along rows (2 cells)');
    expect(store.edit(0, 2, '50')).toBe(
      'The cell at 3000 rpm, 30 kPa is locked. Unlock it to edit.',
    );
  });

  it('When text is pasted into a focused grid cell, then it lands from the selection as one step', async () => {
    await drag([2, 1], [2, 1]);
    cellEl(2, 1)?.focus();
    const paste = new Event('paste', { bubbles: true, cancelable: true });
    Object.defineProperty(paste, 'clipboardData', {
      value: { getData: () => '61,5\t63\r\n71\t73\r\n' },
    });
    cellEl(2, 1)?.dispatchEvent(paste);
    await settle();

    expect(paste.defaultPrevented).toBe(true);
    expect(store.values()[2]).toEqual([60, 61.5, 63, 66, 68]);
    expect(store.values()[3]).toEqual([70, 71, 73, 76, 78]);
    expect(store.historyLabels().undo).toBe('Undo Paste 2 × 2 values (4 cells)');
  });

  it('When the user prefers imperial units, then the MAP axis reads in psi(a)', async () => {
    const corner = () =>
      host().querySelector('.ag-header-cell[col-id="map"]')?.textContent?.trim() ?? '';
    const mapOfRow = (row: number) =>
      host()
        .querySelector(`.ag-row[row-index="${row}"] .ag-cell[col-id="map"]`)
        ?.textContent?.trim() ?? '';
    expect(corner()).toBe('kPa \\ rpm');
    const metricRow = mapOfRow(0);
    units.set('imperial');
    await settle();
    expect(corner()).toBe('psi(a) \\ rpm');
    // 1 psi = 6.894757 kPa (NIST SP 811, 2008 edition, Appendix B.8).
    expect(mapOfRow(0)).toBe((Number(metricRow) / 6.894757).toFixed(2));
  });
});
