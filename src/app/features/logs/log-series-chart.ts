import { DecimalPipe, DOCUMENT } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  type ElementRef,
  computed,
  effect,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { LogSeries } from '@shared/contracts/logs';
import type { ECharts } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { Subject, debounceTime, distinctUntilChanged, finalize, map, of, switchMap } from 'rxjs';
import { apiErrorMessage } from '../../core/api/api-error';
import { LogsApi } from '../../core/api/logs-api';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { ThemePreference } from '../../core/theme/theme-preference';
import { provideCharts } from '../../ui/charts/provide-charts';
import {
  chartHeightPx,
  seriesChartOption,
  type ChartColours,
  type ZoomPercent,
} from './series-chart-option';
import { mergeWindow, seriesInDisplayUnits, zoomWindow } from './series-view';

/** Buckets asked for, for the whole log and for a zoomed window alike. */
const POINTS = 1500;

/** How long the zoom must rest before its window is fetched in full detail, ms. */
const ZOOM_SETTLE_MS = 350;

/** The colour roles, each read from a probe element styled with the theme's custom property. */
const COLOUR_ROLES: readonly (keyof ChartColours)[] = [
  'text',
  'axis',
  'grid',
  'rpm',
  'map',
  'lambda',
  'target',
  'throttle',
  'kept',
  'tooltipBackground',
  'tooltipText',
];

/** The chart's colours as the theme resolves them now (light or dark). */
function readChartColours(probes: HTMLElement, view: Window): ChartColours {
  const colours = {} as Record<keyof ChartColours, string>;
  for (const role of COLOUR_ROLES) {
    const probe = probes.querySelector(`[data-role="${role}"]`);
    colours[role] = probe ? view.getComputedStyle(probe).color : 'gray';
  }
  return colours;
}

/**
 * A parsed log as stacked time-series panels (RPM, MAP, measured vs commanded lambda, throttle
 * when logged) sharing one zoomable time axis, with the stretches the default filter keeps
 * shaded and a strip of the kept share; beside it the filter's funnel and the delay used.
 * ECharts is provided here only, so the library loads with this component (which the log page
 * defers until it scrolls into view). When the zoom rests, its window is fetched again from the
 * server in full detail.
 */
@Component({
  selector: 'app-log-series-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, NgxEchartsDirective, MatIconModule, MatProgressBarModule],
  providers: [provideCharts()],
  templateUrl: './log-series-chart.html',
  styleUrl: './log-series-chart.scss',
})
export class LogSeriesChart {
  private readonly api = inject(LogsApi);
  private readonly theme = inject(ThemePreference);
  private readonly preferences = inject(DisplayPreferences);
  private readonly destroyRef = inject(DestroyRef);
  private readonly view = inject(DOCUMENT).defaultView;

  /** The log to draw. */
  readonly logId = input.required<string>();
  /** The revision the log's ECU ran, if recorded (to say which VE the delay came from). */
  readonly ecuRevisionId = input<string | null>(null);
  /** The vehicle's stoichiometric AFR, to draw AFR for users who read it (null: lambda). */
  readonly stoichAfr = input<number | null>(null);

  /** The whole log, bucketed. */
  protected readonly overview = rxResource({
    params: () => this.logId(),
    stream: ({ params }) => this.api.series(params, { points: POINTS }),
  });

  /** The zoomed-in window in full detail, or null when the whole log is shown. */
  private readonly detail = signal<LogSeries | null>(null);
  /** Whether a zoomed window is being fetched. */
  protected readonly isFetchingDetail = signal(false);
  /** The theme's colours, read once the probes exist and again whenever the scheme changes. */
  private readonly colours = signal<ChartColours | null>(null);
  /** Whether the system asks for a dark scheme (matters when the user follows the system). */
  private readonly isSystemDark = signal(false);
  private readonly probes = viewChild<ElementRef<HTMLElement>>('probes');
  private readonly zoomRests = new Subject<void>();
  private chart: ECharts | null = null;
  // A plain field, not a signal: the option reads it when rebuilt, but a zoom alone must not
  // rebuild the option (that would reset the chart under the user's hand).
  private zoom: ZoomPercent = { start: 0, end: 100 };

  /** What is drawn: the overview with the zoomed window's detail spliced in. */
  private readonly shown = computed(() =>
    this.overview.hasValue() ? mergeWindow(this.overview.value(), this.detail()) : null,
  );

  /** The ECharts option, or null until data and colours are there. */
  protected readonly option = computed(() => {
    const shown = this.shown();
    const colours = this.colours();
    if (shown === null || colours === null || !this.overview.hasValue()) return null;
    const display = seriesInDisplayUnits(
      shown,
      this.preferences.units(),
      this.preferences.mixture(),
      this.stoichAfr(),
    );
    return seriesChartOption(
      display.series,
      this.overview.value().rangeS,
      colours,
      this.zoom,
      display.labels,
    );
  });

  /** The chart's height for its panels. */
  protected readonly heightPx = computed(() =>
    this.overview.hasValue() ? chartHeightPx(this.overview.value()) : 480,
  );

  /** Why the series could not be loaded, if it could not. */
  protected readonly loadError = computed(() => {
    const error = this.overview.error();
    return error === undefined ? null : apiErrorMessage(error, 'The chart could not be loaded.');
  });

  /** Samples the funnel starts from, and how many it keeps. */
  protected readonly keptTotals = computed(() => {
    const funnel = this.overview.hasValue() ? this.overview.value().funnel : null;
    if (!funnel || funnel.length === 0) return null;
    const first = funnel[0];
    const total = first.removed + first.remaining;
    const kept = funnel[funnel.length - 1].remaining;
    return { total, kept, percent: total > 0 ? (100 * kept) / total : 0 };
  });

  constructor() {
    // Canvas charts cannot use CSS variables, so the theme's colours are read into values, and
    // read again when the user or the system switches scheme.
    effect(() => {
      this.theme.choice();
      this.isSystemDark();
      const probes = this.probes()?.nativeElement;
      if (probes && this.view) this.colours.set(readChartColours(probes, this.view));
    });
    const media = this.view?.matchMedia?.('(prefers-color-scheme: dark)');
    if (media) {
      this.isSystemDark.set(media.matches);
      const onChange = (event: MediaQueryListEvent) => this.isSystemDark.set(event.matches);
      media.addEventListener('change', onChange);
      this.destroyRef.onDestroy(() => media.removeEventListener('change', onChange));
    }
    this.zoomRests
      .pipe(
        debounceTime(ZOOM_SETTLE_MS),
        map(() =>
          this.overview.hasValue()
            ? zoomWindow(this.overview.value().rangeS, this.zoom.start, this.zoom.end)
            : null,
        ),
        distinctUntilChanged((a, b) => a?.fromS === b?.fromS && a?.toS === b?.toS),
        switchMap((window) => {
          if (window === null) return of(null);
          this.isFetchingDetail.set(true);
          return this.api
            .series(this.logId(), { points: POINTS, ...window })
            .pipe(finalize(() => this.isFetchingDetail.set(false)));
        }),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (detail) => this.detail.set(detail),
        // A failed detail fetch leaves the overview on screen; the error handler reports it.
        error: () => this.detail.set(null),
      });
  }

  /** Keeps the chart instance to read its zoom from. */
  protected onChartInit(chart: ECharts): void {
    this.chart = chart;
  }

  /** Notes where the zoom is; the window is fetched once it rests. */
  protected onDataZoom(): void {
    const zooms = this.chart?.getOption()['dataZoom'] as
      { start?: number; end?: number }[] | undefined;
    const first = zooms?.[0];
    if (first?.start === undefined || first.end === undefined) return;
    this.zoom = { start: first.start, end: first.end };
    this.zoomRests.next();
  }
}
