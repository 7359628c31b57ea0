import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { RouterLink } from '@angular/router';
import type { RevisionSummary, VeTableResource } from '@shared/contracts/tables';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import {
  REVISION_STATUS_LABELS,
  breakpointsText,
  latestRevisions,
  mapRangeText,
} from './vehicle-detail-text';

/** How many revisions each card lists. */
const REVISIONS_PER_CARD = 3;

/** One card per VE table: its size, head revision and latest revisions, linking to the table. */
@Component({
  selector: 'app-vehicle-table-cards',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule, MatCardModule, RouterLink],
  template: `
    <div class="cards">
      @for (table of tables(); track table.id) {
        <mat-card appearance="outlined" class="card">
          <mat-card-header>
            <mat-card-title>{{ table.name }}</mat-card-title>
            <mat-card-subtitle>{{ breakpoints(table) }}</mat-card-subtitle>
            <mat-card-subtitle>{{ mapRange(table) }}</mat-card-subtitle>
          </mat-card-header>
          <mat-card-content>
            @let revisions = revisionsOf(table.id);
            @if (revisions === undefined) {
              <p class="muted">Loading revisions…</p>
            } @else if (revisions.length === 0) {
              <p class="muted">No revisions yet.</p>
            } @else {
              <ol class="revisions" aria-label="Latest revisions">
                @for (revision of revisions; track revision.id) {
                  <li class="revision">
                    <span class="number">r{{ revision.number }}</span>
                    <span class="chip" [class]="'status-' + revision.status">{{
                      statusLabels[revision.status]
                    }}</span>
                    @if (revision.id === table.headRevisionId) {
                      <span class="head">head</span>
                    }
                    <span class="message">{{ revision.message || 'No message' }}</span>
                    <span class="muted"
                      >{{ revision.authorName }} ·
                      {{ revision.createdAt | date: 'mediumDate' }}</span
                    >
                  </li>
                }
              </ol>
            }
          </mat-card-content>
          @if (canOpenTables()) {
            <mat-card-actions>
              <a mat-button [routerLink]="['/tables', table.id]">Open table</a>
            </mat-card-actions>
          }
        </mat-card>
      } @empty {
        <p class="muted">No VE tables on this vehicle yet.</p>
      }
    </div>
  `,
  styles: `
    .cards {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(320px, 1fr));
      gap: 16px;
      max-width: 1100px;
    }
    .revisions {
      margin: 8px 0 0;
      padding: 0;
      list-style: none;
    }
    .revision {
      display: flex;
      flex-wrap: wrap;
      align-items: baseline;
      gap: 4px 8px;
      padding: 6px 0;
      border-top: 1px solid var(--mat-sys-outline-variant);
    }
    .number {
      font: var(--mat-sys-title-small);
    }
    .message {
      flex-basis: 100%;
    }
    .head {
      font: var(--mat-sys-label-small);
      color: var(--mat-sys-primary);
      text-transform: uppercase;
    }
    .chip {
      padding: 1px 8px;
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-small);
      background: var(--mat-sys-surface-container-high);
    }
    .status-approved {
      background: var(--mat-sys-primary-container);
      color: var(--mat-sys-on-primary-container);
    }
    .status-in_review {
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    .status-sent_back {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .muted {
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class VehicleTableCards {
  private readonly displayPreferences = inject(DisplayPreferences);

  /** The vehicle's tables, oldest first. */
  readonly tables = input.required<VeTableResource[]>();

  /** Each table's revisions by table id; a table missing here is still loading. */
  readonly revisions = input.required<Readonly<Record<string, RevisionSummary[]>>>();

  /** Whether the member may open the table workspace (its route is for tuners and reviewers). */
  readonly canOpenTables = input(false);

  /** Review states by name. */
  protected readonly statusLabels = REVISION_STATUS_LABELS;

  /** A table's size. */
  protected readonly breakpoints = breakpointsText;

  /** A table's MAP span in the user's units. */
  protected mapRange(table: VeTableResource): string {
    return mapRangeText(table, this.displayPreferences.units());
  }

  /** The newest revisions of a table, or undefined while they load. */
  protected revisionsOf(tableId: string): RevisionSummary[] | undefined {
    const list = this.revisions()[tableId];
    return list === undefined ? undefined : latestRevisions(list, REVISIONS_PER_CARD);
  }
}
