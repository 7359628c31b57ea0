import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { PlotLegend as PlotLegendView } from './heat-map-option';

/** The colour scale under a plot: its gradient, labelled ends and how to read it. */
@Component({
  selector: 'app-plot-legend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure class="legend" aria-label="Colour legend">
      <div class="bar" aria-hidden="true" [style.background]="legend().gradient"></div>
      <div class="labels">
        <span>{{ legend().low }}</span>
        <span>{{ legend().mid }}</span>
        <span>{{ legend().high }}</span>
      </div>
      <figcaption class="note">{{ legend().note }}</figcaption>
    </figure>
  `,
  styles: `
    .legend {
      margin: 4px 0 0;
      max-width: 560px;
    }
    .bar {
      height: 12px;
      border-radius: 6px;
      border: 1px solid var(--mat-sys-outline-variant);
    }
    .labels {
      display: flex;
      justify-content: space-between;
      margin-top: 4px;
      font: var(--mat-sys-label-medium);
    }
    .note {
      margin-top: 4px;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class PlotLegend {
  /** What the legend shows. */
  readonly legend = input.required<PlotLegendView>();
}
