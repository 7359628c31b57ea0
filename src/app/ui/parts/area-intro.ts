import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/**
 * The opening of an area page: title, what the area does for the user, and an empty state for
 * its list. Pages whose data is not built yet show only this, never made-up records.
 */
@Component({
  selector: 'app-area-intro',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <h1 class="cs-page-title">{{ title() }}</h1>
    <p class="cs-page-lead">{{ description() }}</p>
    <section class="empty" [attr.aria-label]="title() + ' list'">
      <mat-icon class="empty-icon" aria-hidden="true">{{ icon() }}</mat-icon>
      <h2 class="empty-title">{{ emptyTitle() }}</h2>
      <p class="empty-text">{{ emptyText() }}</p>
      <ng-content />
    </section>
  `,
  styles: `
    .empty {
      display: flex;
      flex-direction: column;
      align-items: center;
      gap: 8px;
      max-width: 72ch;
      padding: 40px 24px;
      border: 1px dashed var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
      text-align: center;
    }
    .empty-icon {
      width: 48px;
      height: 48px;
      font-size: 48px;
      color: var(--mat-sys-primary);
    }
    .empty-title {
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
    .empty-text {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class AreaIntro {
  /** The page heading. */
  readonly title = input.required<string>();
  /** One paragraph on what the area does for the user. */
  readonly description = input.required<string>();
  /** A Material Symbols ligature name for the empty state. */
  readonly icon = input.required<string>();
  /** Heading of the empty state. */
  readonly emptyTitle = input.required<string>();
  /** Sentence of the empty state. */
  readonly emptyText = input.required<string>();
}
