import type { MixtureDisplay, UnitSystem } from '@shared/contracts/preferences';
import {
  ChangeDetectionStrategy,
  Component,
  DOCUMENT,
  DestroyRef,
  computed,
  inject,
  input,
  linkedSignal,
  output,
  signal,
} from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTabsModule } from '@angular/material/tabs';
import type { Vehicle } from '@shared/contracts/vehicles';
import type { ECElementEvent } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { AnalysesApi, type AnalysisResource } from '../../../core/api/analyses-api';
import { apiErrorMessage } from '../../../core/api/api-error';
import { ThemePreference } from '../../../core/theme/theme-preference';
import { provideCharts } from '../../../ui/charts/provide-charts';
import { CellDetail } from './cell-detail';
import { chartTheme, schemeIsDark } from './chart-theme';
import { curvesOption } from './curves-option';
import { HEAT_LAYERS, type HeatLayer, heatLegend, heatMapOption } from './heat-map-option';
import { type CellRef, mapScale, nearestCell } from './plot-format';
import { ColourLegend } from '../grid/colour-legend';
import type { PreviewResult } from '../preview/proposal-preview-compute';
import { type SampleDatum, samplesCaption, samplesLegend, scatterOption } from './scatter-option';

/** The tabs, in order. */
export const PLOT_TABS = ['Heat map', 'Samples', 'Cell'] as const;

/** Index of the Samples tab. */
const SAMPLES_TAB = 1;

/** Samples asked for at first, and at most (the API's ceiling). */
export const SAMPLES_FIRST = 4000;
/** The most samples the plot asks for. */
export const SAMPLES_MOST = 20000;

/**
 * The workspace's plots, in tabs: the table as a heat map (or as VE curves per MAP row), the
 * samples the analysis kept over RPM × MAP coloured by lambda error (fetched the first time the
 * tab opens), and one cell in detail. Clicking a heat-map cell, a curve point or a sample picks
 * that cell. Charts are drawn by ECharts, loaded lazily with this component.
 */
@Component({
  selector: 'app-workspace-plots',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CellDetail,
    MatButtonModule,
    MatButtonToggleModule,
    MatProgressBarModule,
    MatTabsModule,
    NgxEchartsDirective,
    ColourLegend,
  ],
  providers: [provideCharts()],
  templateUrl: './workspace-plots.html',
  styleUrl: './workspace-plots.scss',
})
export class WorkspacePlots {
  private readonly analysesApi = inject(AnalysesApi);
  private readonly document = inject(DOCUMENT);
  private readonly themePreference = inject(ThemePreference);
  private readonly destroyRef = inject(DestroyRef);

  /** RPM breakpoints (columns), ascending. */
  readonly rpmAxis = input.required<readonly number[]>();
  /** MAP breakpoints in kPa (rows), ascending. */
  readonly mapAxisKpa = input.required<readonly number[]>();
  /** VE now (with unsaved edits), `[row][col]`. */
  readonly values = input.required<readonly (readonly number[])[]>();
  /** VE of the saved revision, to tell edits in the cell detail. */
  readonly baseValues = input<readonly (readonly number[])[]>([]);
  /** The analysis shown, if any. */
  readonly analysis = input<AnalysisResource | null>(null);
  /**
   * The live preview of applying the analysis: the proposal and change layers, the curves'
   * dashed line and the cell detail show what the apply would write, as the grid does.
   */
  readonly preview = input<PreviewResult | null>(null);
  /** The table's vehicle, for the airflow and duty of a cell. */
  readonly vehicle = input<Vehicle | null>(null);
  /** The picked cell (from the grid or an earlier pick). */
  readonly selectedCell = input<CellRef | null>(null);
  /** Whether to draw for a dark page; null follows the page's own scheme. */
  readonly isDark = input<boolean | null>(null);
  /** Lambda or AFR in the cell detail, as the user prefers. */
  readonly mixture = input<MixtureDisplay>('lambda');
  /** Metric or imperial: MAP on the axes, line names and tooltips in kPa or psi(a). */
  readonly units = input<UnitSystem>('metric');
  /** A cell picked on a chart. */
  readonly cellPick = output<CellRef>();

  /** The tab shown. */
  protected readonly tabIndex = signal(0);
  /** Whether the heat-map tab shows curves instead of the heat map. */
  protected readonly showCurves = signal(false);
  /** The heat-map layer; back to VE whenever another analysis (or none) comes. */
  protected readonly layer = linkedSignal<HeatLayer>(() => {
    this.analysis();
    return 've';
  });
  /** The layer choices. */
  protected readonly layers = HEAT_LAYERS;
  /** The tab labels. */
  protected readonly tabs = PLOT_TABS;
  /** The picked cell: the input's, or the last one clicked here. */
  protected readonly picked = linkedSignal<CellRef | null>(() => this.selectedCell());

  /** Whether the operating system asks for dark (followed while the page follows it). */
  private readonly prefersDark = signal(false);

  /** The chart frame's colours in the page's scheme. */
  protected readonly theme = computed(() => {
    // Read again when the user picks another scheme in the toolbar.
    this.themePreference.choice();
    const view = this.document.defaultView;
    const style = view?.getComputedStyle(this.document.documentElement);
    const dark =
      this.isDark() ??
      schemeIsDark(style?.getPropertyValue('color-scheme') ?? '', this.prefersDark());
    return chartTheme(dark, (token) => style?.getPropertyValue(token) ?? '');
  });

  /** The heat map's data. */
  private readonly heatInput = computed(() => ({
    rpmAxis: this.rpmAxis(),
    mapAxisKpa: this.mapAxisKpa(),
    values: this.values(),
    baseValues: this.baseValues(),
    analysis: this.analysis(),
    preview: this.preview(),
    layer: this.layer(),
    selectedCell: this.picked(),
    theme: this.theme(),
    units: this.units(),
  }));
  /** The heat map. */
  protected readonly heatOption = computed(() => heatMapOption(this.heatInput()));
  /** The heat map's legend. */
  protected readonly heatLegend = computed(() => heatLegend(this.heatInput()));
  /** The curves. */
  protected readonly curvesOption = computed(() =>
    curvesOption({
      rpmAxis: this.rpmAxis(),
      mapAxisKpa: this.mapAxisKpa(),
      values: this.values(),
      proposal: this.analysis() ? (this.preview()?.values ?? null) : null,
      selectedCell: this.picked(),
      theme: this.theme(),
      units: this.units(),
    }),
  );

  /**
   * The analysis whose samples were asked for: set when the Samples tab shows an analysis, kept
   * while other tabs show, so the samples are fetched once per analysis and only when wanted.
   */
  private readonly samplesFor = linkedSignal<{ tab: number; id: string | null }, string | null>({
    source: () => ({ tab: this.tabIndex(), id: this.analysis()?.id ?? null }),
    computation: (source, previous) =>
      source.tab === SAMPLES_TAB && source.id ? source.id : (previous?.value ?? null),
  });
  /** How many samples to ask for. */
  protected readonly samplesMax = signal(SAMPLES_FIRST);
  /** The kept samples of the analysis, once asked for. */
  protected readonly samples = rxResource({
    params: () => {
      const id = this.samplesFor();
      return id ? { id, max: this.samplesMax() } : undefined;
    },
    stream: ({ params }) => this.analysesApi.samples(params.id, params.max),
  });
  /** The samples of the analysis shown (not of an earlier one still held). */
  protected readonly shownSamples = computed(() => {
    const id = this.analysis()?.id;
    return id && id === this.samplesFor() && this.samples.hasValue() ? this.samples.value() : null;
  });
  /** The samples plot. */
  protected readonly scatterOption = computed(() => {
    const samples = this.shownSamples();
    return samples
      ? scatterOption({
          rpmAxis: this.rpmAxis(),
          mapAxisKpa: this.mapAxisKpa(),
          samples,
          theme: this.theme(),
          units: this.units(),
        })
      : null;
  });
  /** One sentence about the samples shown. */
  protected readonly samplesCaption = computed(() => {
    const samples = this.shownSamples();
    return samples ? samplesCaption(samples) : '';
  });
  /** Whether more samples can be asked for. */
  protected readonly canShowMore = computed(() => {
    const samples = this.shownSamples();
    return !!samples && samples.returned < samples.total && this.samplesMax() < SAMPLES_MOST;
  });
  /** Why the samples could not be loaded, if they could not. */
  protected readonly samplesError = computed(() =>
    this.samples.error()
      ? apiErrorMessage(this.samples.error(), 'The samples could not be loaded.')
      : null,
  );
  /** The samples' legend. */
  protected readonly samplesLegend = samplesLegend();

  constructor() {
    this.followSystemScheme();
  }

  /** Shows the tab at `index`. */
  protected showTab(index: number): void {
    this.tabIndex.set(index);
  }

  /** Asks for up to the most samples the API gives. */
  protected showMoreSamples(): void {
    this.samplesMax.set(SAMPLES_MOST);
  }

  /** A click on the heat map: `[col, row, …]` is the cell. */
  protected pickFromHeatMap(event: ECElementEvent): void {
    const value = event.value as unknown;
    if (!Array.isArray(value)) return;
    this.pick({ row: value[1] as number, col: value[0] as number });
  }

  /** A click on a curve point: the series is the MAP row, the point the RPM column. */
  protected pickFromCurves(event: ECElementEvent): void {
    const row = event.seriesIndex ?? -1;
    if (event.seriesType !== 'line' || row < 0 || row >= this.mapAxisKpa().length) return;
    this.pick({ row, col: event.dataIndex });
  }

  /** A click on a sample: the cell whose breakpoints lie nearest (its MAP back in kPa). */
  protected pickFromSamples(event: ECElementEvent): void {
    const value = event.value as unknown as SampleDatum | undefined;
    if (!Array.isArray(value)) return;
    const mapKpa = mapScale(this.units()).toKpa(value[1]);
    this.pick(nearestCell(this.rpmAxis(), this.mapAxisKpa(), value[0], mapKpa));
  }

  private pick(cell: CellRef): void {
    this.picked.set(cell);
    this.cellPick.emit(cell);
  }

  /** Keeps `prefersDark` in step with the operating system while this component lives. */
  private followSystemScheme(): void {
    const media = this.document.defaultView?.matchMedia?.('(prefers-color-scheme: dark)');
    if (!media) return;
    this.prefersDark.set(media.matches);
    const onChange = (event: MediaQueryListEvent) => this.prefersDark.set(event.matches);
    media.addEventListener('change', onChange);
    this.destroyRef.onDestroy(() => media.removeEventListener('change', onChange));
  }
}

export default WorkspacePlots;
