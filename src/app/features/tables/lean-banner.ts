import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { LeanFlag } from '../../core/api/analyses-api';
import { LEAN_CAUTION, leanFlagLine } from './analysis-text';

/** The loud banner over the grid listing cells measured lean under load. */
@Component({
  selector: 'app-lean-banner',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <section class="banner" role="alert" aria-labelledby="lean-banner-title">
      <mat-icon class="icon" aria-hidden="true">warning</mat-icon>
      <div>
        <h2 id="lean-banner-title" class="title">
          Lean under load in {{ flags().length }} {{ flags().length === 1 ? 'cell' : 'cells' }}
        </h2>
        <p class="caution">{{ caution }}</p>
        <ul class="cells">
          @for (line of lines(); track line.key) {
            <li>{{ line.text }}</li>
          }
        </ul>
        <p class="hint">Flagged cells carry a ⚠ and a black-and-white ring in the grid.</p>
      </div>
    </section>
  `,
  styles: `
    .banner {
      display: flex;
      gap: 12px;
      margin: 0 0 16px;
      padding: 12px 16px;
      border: 2px solid var(--mat-sys-error);
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .icon {
      flex: none;
    }
    .title {
      margin: 0 0 4px;
      font: var(--mat-sys-title-medium);
    }
    .caution {
      margin: 0 0 8px;
      font-weight: 600;
    }
    .cells {
      margin: 0 0 4px;
      padding-left: 20px;
      columns: 2 28em;
    }
    .hint {
      margin: 0;
      font: var(--mat-sys-body-small);
    }
  `,
})
export class LeanBanner {
  /** The analysis's lean flags, worst first. */
  readonly flags = input.required<readonly LeanFlag[]>();

  /** The caution every lean flag carries. */
  protected readonly caution = LEAN_CAUTION;

  /** One line per flagged cell. */
  protected readonly lines = computed(() =>
    this.flags().map((flag) => ({ key: `${flag.row}:${flag.col}`, text: leanFlagLine(flag) })),
  );
}
