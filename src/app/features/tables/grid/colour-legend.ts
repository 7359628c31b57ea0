import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { LegendView } from './overlays';

/** The colour scale under the grid: its gradient, end labels, how to read it and its marks. */
@Component({
  selector: 'app-colour-legend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure class="legend" aria-label="Colour legend">
      <div class="bar" aria-hidden="true" [style.background]="legend().gradient"></div>
      <div class="labels">
        <span>{{ legend().low }}</span>
        <span>{{ legend().mid }}</span>
        <span>{{ legend().high }}</span>
      </div>
      <figcaption class="note">
        {{ legend().note }}
        @if (legend().marks; as marks) {
          <span class="marks" data-testid="legend-marks">{{ marks }}</span>
        }
      </figcaption>
    </figure>
  `,
  styles: `
    .legend {
      margin: 12px 0 0;
      max-width: 560px;
    }
    .bar {
      height: 14px;
      border-radius: 7px;
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
    .marks {
      display: block;
      margin-top: 2px;
    }
  `,
})
export class ColourLegend {
  /** What the legend shows. */
  readonly legend = input.required<LegendView>();
}
