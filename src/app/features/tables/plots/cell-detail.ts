import type { MixtureDisplay } from '@shared/contracts/preferences';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import type { Vehicle } from '@shared/contracts/vehicles';
import type { AnalysisResource } from '../../../core/api/analyses-api';
import type { PreviewResult } from '../preview/proposal-preview-compute';
import { cellDetail } from './cell-detail-text';
import type { CellRef } from './plot-format';

/**
 * One cell in detail: breakpoints, VE now and what the apply would write there and how, what the
 * analysis measured there, and the airflow and injector duty at that cell, with the assumptions
 * behind them. A lean-under-load flag, a cell held under load and a duty near the injector's
 * limit are called out.
 */
@Component({
  selector: 'app-cell-detail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatCardModule],
  template: `
    @if (detail(); as d) {
      <mat-card appearance="outlined" class="card">
        <mat-card-header>
          <mat-card-title>Cell {{ d.title }}</mat-card-title>
          <mat-card-subtitle>{{ d.subtitle }}</mat-card-subtitle>
        </mat-card-header>
        <mat-card-content>
          <dl class="lines">
            @for (l of d.lines; track l.label) {
              <div
                class="line"
                [class.lean]="l.tone === 'lean'"
                [class.warn]="l.tone === 'warn'"
                [class.held]="l.tone === 'held'"
                [class.watch]="l.tone === 'watch'"
              >
                <dt>{{ l.label }}</dt>
                <dd>{{ l.value }}</dd>
              </div>
            }
          </dl>
          <p class="assumptions">{{ d.assumptions }}</p>
          <p class="caution">
            Figures are estimates to guide the next step; a qualified person decides, following
            local codes and licensed practice.
          </p>
        </mat-card-content>
      </mat-card>
    } @else {
      <p class="empty">Pick a cell on the heat map, on the samples or in the grid.</p>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .card {
      max-width: 640px;
    }
    .lines {
      display: grid;
      grid-template-columns: max-content 1fr;
      gap: 4px 16px;
      margin: 8px 0 0;
    }
    .line {
      display: contents;
    }
    dt {
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-label-large);
    }
    dd {
      margin: 0;
      font: var(--mat-sys-body-medium);
      font-variant-numeric: tabular-nums;
    }
    .lean dt,
    .lean dd,
    .warn dt,
    .warn dd {
      color: var(--mat-sys-error);
      font-weight: 600;
    }
    // Held under load: bold in the theme's tertiary colour, apart from the lean lines' error red.
    .held dt,
    .held dd {
      color: var(--mat-sys-tertiary);
      font-weight: 600;
    }
    .watch dt {
      font-style: italic;
    }
    .assumptions,
    .caution,
    .empty {
      margin: 12px 0 0;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class CellDetail {
  /** RPM breakpoints, ascending. */
  readonly rpmAxis = input.required<readonly number[]>();
  /** MAP breakpoints in kPa, ascending. */
  readonly mapAxisKpa = input.required<readonly number[]>();
  /** VE now (with unsaved edits), `[row][col]`. */
  readonly values = input.required<readonly (readonly number[])[]>();
  /** VE of the saved revision, to tell an edit. */
  readonly baseValues = input<readonly (readonly number[])[]>([]);
  /** The analysis, if any. */
  readonly analysis = input<AnalysisResource | null>(null);
  /** The live preview of applying it: what the apply would write at the cell, and how. */
  readonly preview = input<PreviewResult | null>(null);
  /** The vehicle, for its engine. */
  readonly vehicle = input<Pick<Vehicle, 'engine'> | null>(null);
  /** The cell to show; null shows a hint. */
  readonly cell = input<CellRef | null>(null);
  /** Lambda or AFR, as the user prefers. */
  readonly mixture = input<MixtureDisplay>('lambda');

  /** The cell's lines, or null when no cell is picked (or it is off the table). */
  protected readonly detail = computed(() => {
    const cell = this.cell();
    if (!cell || cell.row >= this.mapAxisKpa().length || cell.col >= this.rpmAxis().length) {
      return null;
    }
    return cellDetail({
      rpmAxis: this.rpmAxis(),
      mapAxisKpa: this.mapAxisKpa(),
      values: this.values(),
      baseValues: this.baseValues(),
      analysis: this.analysis(),
      preview: this.preview(),
      vehicle: this.vehicle(),
      cell,
      mixture: this.mixture(),
    });
  });
}
