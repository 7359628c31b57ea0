import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { LeanFlag } from '../../../core/api/analyses-api';
import {
  LEAN_CAUTION,
  LEAN_SEVERITY,
  LEAN_WORDS_EXPLAINED,
  isLoudFlag,
  leanFlagLine,
  watchLine,
} from './analysis-text';

/** One flag as the banner lists it. */
interface FlagLine {
  /** Stable key: the cell. */
  readonly key: string;
  /** The flag in words. */
  readonly text: string;
}

function flagLines(flags: readonly LeanFlag[]): FlagLine[] {
  return flags.map((flag) => ({ key: `${flag.row}:${flag.col}`, text: leanFlagLine(flag) }));
}

/**
 * The banner over the grid for cells measured lean under load: loud for the flags with enough
 * data behind them ("stop", "warning"), with what each word asks of the user; quiet, apart, for
 * the cells that only look lean on too little data ("watch": log them again).
 */
@Component({
  selector: 'app-lean-banner',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    @if (loud().length > 0) {
      <section class="banner" role="alert" aria-labelledby="lean-banner-title">
        <mat-icon class="icon" aria-hidden="true">warning</mat-icon>
        <div>
          <h2 id="lean-banner-title" class="title">
            Lean under load in {{ loud().length }} {{ loud().length === 1 ? 'cell' : 'cells' }}
          </h2>
          <p class="caution">{{ caution }}</p>
          <p class="words" data-testid="lean-words">{{ words }}</p>
          <ul class="cells">
            @for (line of loudLines(); track line.key) {
              <li>{{ line.text }}</li>
            }
          </ul>
          <p class="hint">Flagged cells carry a ⚠ and a black-and-white ring in the grid.</p>
        </div>
      </section>
    }
    @if (watch().length > 0) {
      <section class="watch" role="status" aria-labelledby="lean-watch-title">
        <mat-icon class="icon" aria-hidden="true">help_outline</mat-icon>
        <div>
          <h2 id="lean-watch-title" class="watch-title">{{ watchTitle() }}</h2>
          <p class="hint">
            “Watch”: {{ watchAction }}. These cells carry a ? in the grid; no step is asked of the
            engine until a log measures them.
          </p>
          <ul class="cells quiet">
            @for (line of watchLines(); track line.key) {
              <li>{{ line.text }}</li>
            }
          </ul>
        </div>
      </section>
    }
  `,
  styles: `
    .banner,
    .watch {
      display: flex;
      gap: 12px;
      margin: 0 0 16px;
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium);
    }
    .banner {
      border: 2px solid var(--mat-sys-error);
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .watch {
      border: 1px dashed var(--mat-sys-outline);
      background: var(--mat-sys-surface-container-low);
      color: var(--mat-sys-on-surface);
    }
    .icon {
      flex: none;
    }
    .title {
      margin: 0 0 4px;
      font: var(--mat-sys-title-medium);
    }
    .watch-title {
      margin: 0 0 4px;
      font: var(--mat-sys-title-small);
    }
    .caution {
      margin: 0 0 8px;
      font-weight: 600;
    }
    .words {
      margin: 0 0 8px;
    }
    .cells {
      margin: 0 0 4px;
      padding-left: 20px;
      columns: 2 28em;
    }
    .quiet {
      font: var(--mat-sys-body-small);
    }
    .hint {
      margin: 0 0 4px;
      font: var(--mat-sys-body-small);
    }
  `,
})
export class LeanBanner {
  /** The analysis's lean flags: stop, then warning, then watch. */
  readonly flags = input.required<readonly LeanFlag[]>();

  /** The caution every loud lean flag carries. */
  protected readonly caution = LEAN_CAUTION;
  /** What "stop" and "warning" ask of the user. */
  protected readonly words = LEAN_WORDS_EXPLAINED;
  /** What "watch" asks of the user. */
  protected readonly watchAction = LEAN_SEVERITY.watch.action;

  /** Flags with the weight a proposal trusts: "stop" and "warning". */
  protected readonly loud = computed(() => this.flags().filter(isLoudFlag));
  /** Flags on too little data: "watch". */
  protected readonly watch = computed(() => this.flags().filter((flag) => !isLoudFlag(flag)));
  /** One line per loud flag. */
  protected readonly loudLines = computed(() => flagLines(this.loud()));
  /** One line per watched flag. */
  protected readonly watchLines = computed(() => flagLines(this.watch()));
  /** The quiet section's heading. */
  protected readonly watchTitle = computed(() => watchLine(this.watch().length));
}
