import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatTableModule } from '@angular/material/table';
import { catchError, map, of } from 'rxjs';
import type { Vehicle } from '@shared/contracts/vehicles';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { Session } from '../../core/auth/session';
import { AreaIntro } from '../../shared/ui/area-intro';
import { textForRoles } from '../../shared/ui/role-text';
import { engineSummary, fuelSummary, gearingSummary } from './vehicle-summary';

/** The vehicles area: the shop's vehicles with their engine, fuel and gearing at a glance. */
@Component({
  selector: 'app-vehicles-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaIntro, MatTableModule],
  template: `
    <div class="cs-page">
      @if (vehicles(); as list) {
        @if (list.length === 0) {
          <app-area-intro
            title="Vehicles"
            icon="directions_car"
            emptyTitle="No vehicles yet"
            emptyText="This shop has no vehicles on record yet."
            [description]="description()"
          />
        } @else {
          <h1 class="cs-page-title">Vehicles</h1>
          <p class="cs-page-lead">{{ description() }}</p>
          <table mat-table [dataSource]="list" class="vehicles" aria-label="Vehicles of this shop">
            <ng-container matColumnDef="label">
              <th mat-header-cell *matHeaderCellDef>Vehicle</th>
              <td mat-cell *matCellDef="let v">
                <div class="label">{{ v.label }}</div>
                <div class="muted">{{ v.description }}</div>
              </td>
            </ng-container>
            <ng-container matColumnDef="engine">
              <th mat-header-cell *matHeaderCellDef>Engine</th>
              <td mat-cell *matCellDef="let v">{{ engine(v) }}</td>
            </ng-container>
            <ng-container matColumnDef="fuel">
              <th mat-header-cell *matHeaderCellDef>Fuel</th>
              <td mat-cell *matCellDef="let v">{{ fuel(v) }}</td>
            </ng-container>
            <ng-container matColumnDef="gearing">
              <th mat-header-cell *matHeaderCellDef>Gearing</th>
              <td mat-cell *matCellDef="let v">{{ gearing(v) }}</td>
            </ng-container>
            <tr mat-header-row *matHeaderRowDef="columns"></tr>
            <tr mat-row *matRowDef="let row; columns: columns"></tr>
          </table>
        }
      } @else {
        <p class="cs-page-lead">Loading vehicles…</p>
      }
    </div>
  `,
  styles: `
    .vehicles {
      max-width: 1100px;
    }
    .label {
      font: var(--mat-sys-title-small);
    }
    .muted {
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class VehiclesPage {
  private readonly session = inject(Session);
  private readonly api = inject(VehiclesApi);

  /** Columns of the table, in order. */
  protected readonly columns = ['label', 'engine', 'fuel', 'gearing'];

  /** The shop's vehicles; undefined while loading, empty when the list could not be read. */
  protected readonly vehicles = toSignal(
    this.api.list().pipe(
      map((res) => res.items),
      // The global error handler already told the user; show the empty state meanwhile.
      catchError(() => of([] as Vehicle[])),
    ),
  );

  /** One line on the engine. */
  protected readonly engine = engineSummary;
  /** The fuel and its ratio. */
  protected readonly fuel = fuelSummary;
  /** The gearing. */
  protected readonly gearing = gearingSummary;

  /** What this area does, written for the user's own role. */
  protected readonly description = computed(() =>
    textForRoles(
      this.session.user()?.roles ?? [],
      {
        operator:
          'Vehicles are the cars your shop calibrates. Open one to see the session plans assigned to it and the logs already recorded.',
        reviewer:
          'Vehicles are the cars your shop calibrates. Each one carries its engine facts, its VE table revisions and the logs behind them, so you can read the whole history before approving a change.',
        admin:
          'Vehicles are the cars your shop calibrates, each with its engine facts, tables, logs and session plans.',
      },
      'Each vehicle holds the engine facts the fuelling model needs (displacement, injectors, fuel, gearing), its VE table revisions and the logs recorded on it. Start here after a hardware change.',
    ),
  );
}

export default VehiclesPage;
