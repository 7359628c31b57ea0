import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import type { Vehicle } from '@shared/contracts/vehicles';
import { NGX_ECHARTS_CONFIG } from 'ngx-echarts';
import type {
  AnalysisCell,
  AnalysisResource,
  AnalysisSamples,
} from '../../../core/api/analyses-api';
import { noAnimations } from '../../../../testing/harness-helpers';
import { ASSUMED_GUARD } from '../../../../testing/table-fixtures';
import type { PreviewResult } from '../preview/proposal-preview-compute';
import type { CellRef } from './plot-format';
import { WorkspacePlots } from './workspace-plots';

/** A stand-in for an ECharts instance: keeps the options set and the event handlers bound. */
class FakeChart {
  /** Every option passed to setOption, in order. */
  readonly options: { series?: { type?: string }[] }[] = [];
  /** Handlers by event name. */
  readonly handlers = new Map<string, (params: unknown) => void>();
  setOption(option: { series?: { type?: string }[] }): void {
    this.options.push(option);
  }
  on(name: string, handler: (params: unknown) => void): void {
    this.handlers.set(name, handler);
  }
  off(name: string): void {
    this.handlers.delete(name);
  }
  isDisposed(): boolean {
    return false;
  }
  dispose(): void {}
  resize(): void {}
  showLoading(): void {}
  hideLoading(): void {}
  /** The series types of the latest option. */
  seriesTypes(): (string | undefined)[] {
    return (this.options.at(-1)?.series ?? []).map((s) => s.type);
  }
}

const cellOf = (lambdaErrorPct: number): AnalysisCell => ({
  samples: 20,
  weight: 9,
  ratio: 1 + lambdaErrorPct / 100,
  spread: 0.01,
  effectiveCount: 7,
  lambdaErrorPct,
  worstLeanPct: null,
  lambdaMeasured: 0.9,
  lambdaCommanded: 0.9,
  proposal: 60,
  changePct: lambdaErrorPct,
  status: 'trusted',
});

const ANALYSIS: AnalysisResource = {
  id: 'a1',
  tableId: 't1',
  baseRevisionId: 'r1',
  logIds: ['l1'],
  settings: {},
  cells: [
    [cellOf(2), cellOf(-1), cellOf(0)],
    [cellOf(4), cellOf(1), cellOf(-3)],
  ],
  proposal: [
    [51, 54, 60],
    [72, 81, 87],
  ],
  filterReport: { logs: [] },
  leanFlags: [],
  guard: ASSUMED_GUARD,
  createdAt: '2026-03-01T10:00:00.000Z',
};

/** What the apply would write: the 100 kPa row held at 1000 rpm, filled richer at 3000 rpm. */
const PREVIEW: PreviewResult = {
  values: [
    [51, 55, 60],
    [70, 80, 93.5],
  ],
  origin: [
    ['measured', 'unchanged', 'unchanged'],
    ['held', 'unchanged', 'filled'],
  ],
  heldCount: 1,
  guard: { loadLineKpa: 91.19, leanAllowance: 0.01 },
};

const SAMPLES: AnalysisSamples = {
  rpm: [1200, 2900],
  mapKpa: [45, 95],
  lambdaErrorPct: [3, -2],
  logIndex: [0, 0],
  total: 2,
  returned: 2,
};

const VEHICLE = {
  engine: { displacementL: 2, cylinders: 4, fuel: 'gasoline', stoichAfr: 14.7, injectorCcMin: 550 },
} as Vehicle;

/** Lets ngx-echarts create its charts: it does so in a timeout after the view is made. */
async function settleCharts(fixture: ComponentFixture<unknown>): Promise<void> {
  for (let i = 0; i < 3; i++) {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }
}

/**
 * The request to `url` once it is sent. Harness actions wait until the app is stable, and an
 * open request keeps it busy, so a tab that fetches is selected without awaiting, the request
 * answered here, and only then the selection awaited.
 */
async function sentRequest(http: HttpTestingController, url: string): Promise<TestRequest> {
  const deadline = Date.now() + 4000;
  while (Date.now() < deadline) {
    const [found] = http.match(url);
    if (found) return found;
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
  throw new Error(`sentRequest: no request to ${url}`);
}

describe('WorkspacePlots', () => {
  let fixture: ComponentFixture<WorkspacePlots>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let charts: FakeChart[];
  let picks: CellRef[];

  beforeEach(async () => {
    charts = [];
    picks = [];
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), noAnimations],
    });
    // ECharts draws on a canvas jsdom lacks: the component's lazy ECharts is swapped for fakes.
    TestBed.overrideComponent(WorkspacePlots, {
      set: {
        providers: [
          {
            provide: NGX_ECHARTS_CONFIG,
            useValue: {
              echarts: {
                init: () => {
                  const chart = new FakeChart();
                  charts.push(chart);
                  return chart;
                },
              },
            },
          },
        ],
      },
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(WorkspacePlots);
    fixture.componentRef.setInput('rpmAxis', [1000, 2000, 3000]);
    fixture.componentRef.setInput('mapAxisKpa', [40, 100]);
    fixture.componentRef.setInput('values', [
      [50, 55, 60],
      [70, 80, 85],
    ]);
    fixture.componentRef.setInput('vehicle', VEHICLE);
    fixture.componentRef.setInput('isDark', false);
    fixture.componentInstance.cellPick.subscribe((cell) => picks.push(cell));
    loader = TestbedHarnessEnvironment.loader(fixture);
    await settleCharts(fixture);
  });
  afterEach(() => http.verify());

  it('When there is no analysis, then the heat map shows VE and Samples cannot open', async () => {
    const tabs = await loader.getHarness(MatTabGroupHarness);
    const labels = await Promise.all((await tabs.getTabs()).map((tab) => tab.getLabel()));
    expect(labels).toEqual(['Heat map', 'Samples', 'Cell']);
    const [samplesTab] = await tabs.getTabs({ label: 'Samples' });
    expect(await samplesTab.isDisabled()).toBe(true);
    expect(charts).toHaveLength(1);
    expect(charts[0].seriesTypes()).toEqual(['heatmap']);
    const change = await loader.getHarness(MatButtonToggleHarness.with({ text: 'Change %' }));
    expect(await change.isDisabled()).toBe(true);
  });

  it('When a heat-map cell is clicked, then cellPick tells it and the Cell tab shows it', async () => {
    charts[0].handlers.get('click')?.({ value: [2, 1, 0.5, 85] });
    expect(picks).toEqual([{ row: 1, col: 2 }]);
    const tabs = await loader.getHarness(MatTabGroupHarness);
    await tabs.selectTab({ label: 'Cell' });
    const text = await (await tabs.getSelectedTab()).getTextContent();
    expect(text).toContain('Cell 3,000 rpm · 100 kPa');
    expect(text).toContain('Injector duty');
  });

  it('When the Samples tab first opens, then the samples are asked for once', async () => {
    fixture.componentRef.setInput('analysis', ANALYSIS);
    await fixture.whenStable();
    const tabs = await loader.getHarness(MatTabGroupHarness);
    const opening = tabs.selectTab({ label: 'Samples' });
    (await sentRequest(http, '/api/analyses/a1/samples?max=4000')).flush(SAMPLES);
    await opening;
    await settleCharts(fixture);
    expect(await (await tabs.getSelectedTab()).getTextContent()).toContain(
      'All 2 samples the analysis kept.',
    );
    const scatter = charts.at(-1) as FakeChart;
    expect(scatter.seriesTypes()).toEqual(['scatter', 'scatter']);

    // A sample picks the cell whose breakpoints are nearest.
    scatter.handlers.get('click')?.({ value: [2900, 95, -2, 0] });
    expect(picks).toEqual([{ row: 1, col: 2 }]);

    // Back and forth again: the samples are kept, not asked for again.
    await tabs.selectTab({ label: 'Heat map' });
    await tabs.selectTab({ label: 'Samples' });
    http.expectNone('/api/analyses/a1/samples?max=4000');
  });

  it('When the user prefers imperial units, then MAP reads in psi(a) and a sample picks its cell', async () => {
    fixture.componentRef.setInput('units', 'imperial');
    fixture.componentRef.setInput('analysis', ANALYSIS);
    await settleCharts(fixture);
    const heat = charts[0].options.at(-1) as { yAxis: { name: string; data: string[] } };
    // 40 kPa = 5.80 psi, 100 kPa = 14.50 psi (NIST SP 811, 2008 edition, Appendix B.8) [S]
    expect(heat.yAxis).toEqual(
      expect.objectContaining({ name: 'MAP psi(a)', data: ['5.8', '14.5'] }),
    );

    const tabs = await loader.getHarness(MatTabGroupHarness);
    const opening = tabs.selectTab({ label: 'Samples' });
    (await sentRequest(http, '/api/analyses/a1/samples?max=4000')).flush(SAMPLES);
    await opening;
    await settleCharts(fixture);
    const scatter = charts.at(-1) as FakeChart;
    const drawn = scatter.options.at(-1) as { yAxis: { name: string } };
    expect(drawn.yAxis.name).toBe('MAP psi(a)');
    // The chart hands back the sample in psi(a): 95 kPa = 13.78 psi lies nearest the 100 kPa row.
    scatter.handlers.get('click')?.({ value: [2900, 13.78, -2, 0] });
    expect(picks).toEqual([{ row: 1, col: 2 }]);
  });

  it('When another analysis comes while Samples shows, then its samples are asked for', async () => {
    fixture.componentRef.setInput('analysis', ANALYSIS);
    await fixture.whenStable();
    const tabs = await loader.getHarness(MatTabGroupHarness);
    const opening = tabs.selectTab({ label: 'Samples' });
    (await sentRequest(http, '/api/analyses/a1/samples?max=4000')).flush(SAMPLES);
    await opening;
    fixture.componentRef.setInput('analysis', { ...ANALYSIS, id: 'a2' });
    (await sentRequest(http, '/api/analyses/a2/samples?max=4000')).flush(
      { error: { code: 'conflict', message: 'Log l1 of this analysis is gone' } },
      {
        status: 409,
        statusText: 'Conflict',
      },
    );
    await fixture.whenStable();
    expect(await (await tabs.getSelectedTab()).getTextContent()).toContain(
      'Log l1 of this analysis is gone',
    );
  });

  it('When the change layer shows a preview, then its figures are what the apply writes', async () => {
    fixture.componentRef.setInput('analysis', ANALYSIS);
    fixture.componentRef.setInput('baseValues', [
      [50, 55, 60],
      [70, 80, 85],
    ]);
    fixture.componentRef.setInput('preview', PREVIEW);
    await fixture.whenStable();
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Change %' }))).check();
    await settleCharts(fixture);
    const latest = charts[0].options.at(-1) as { series: { data: { value: number[] }[] }[] };
    const figures = latest.series[0].data
      .map(({ value }) => [value[1], value[0], Number(value[3].toFixed(6))])
      .sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    // 51/50 → +2 %, 93.5/85 → +10 %, the rest 0: not the analysis's changePct (2, −1, 0, 4, 1, −3).
    expect(figures).toEqual([
      [0, 0, 2],
      [0, 1, 0],
      [0, 2, 0],
      [1, 0, 0],
      [1, 1, 0],
      [1, 2, 10],
    ]);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'Dashed outline: held under load, needs data',
    );

    // The held cell's detail says so.
    charts[0].handlers.get('click')?.({ value: [0, 1, 0.5, 0] });
    const tabs = await loader.getHarness(MatTabGroupHarness);
    await tabs.selectTab({ label: 'Cell' });
    const text = await (await tabs.getSelectedTab()).getTextContent();
    expect(text).toContain('Held under load: needs data (keeps its value)');
    expect(text).toContain('Needs data: at or above the load line (91.2 kPa)');
  });

  it('When Curves and a layer are chosen, then the chart shows lines and the layer', async () => {
    fixture.componentRef.setInput('analysis', ANALYSIS);
    await fixture.whenStable();
    const lambda = await loader.getHarness(MatButtonToggleHarness.with({ text: 'Lambda error %' }));
    await lambda.check();
    await settleCharts(fixture);
    const heat = charts[0];
    const latest = heat.options.at(-1) as { series: { name: string }[] };
    expect(latest.series[0].name).toBe('Lambda error %');

    const curves = await loader.getHarness(MatButtonToggleHarness.with({ text: 'Curves' }));
    await curves.check();
    await settleCharts(fixture);
    const lines = charts.at(-1) as FakeChart;
    expect(lines).not.toBe(heat);
    expect(lines.seriesTypes()).toEqual(['line', 'line']);
    // A point of the 100 kPa line (series 1) at 2000 rpm (point 1) picks that cell.
    lines.handlers.get('click')?.({ seriesType: 'line', seriesIndex: 1, dataIndex: 1 });
    expect(picks).toEqual([{ row: 1, col: 1 }]);
  });
});
