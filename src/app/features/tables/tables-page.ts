import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { VeTableResource } from '@shared/contracts/tables';
import type { Vehicle } from '@shared/contracts/vehicles';
import { catchError, forkJoin, map, of, switchMap } from 'rxjs';
import { TablesApi } from '../../core/api/tables-api';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { Session } from '../../core/auth/session';
import { AreaIntro } from '../../ui/parts/area-intro';
import { textForRoles } from '../../ui/parts/role-text';

/** A vehicle with its tables. */
interface VehicleTables {
  vehicle: Vehicle;
  tables: VeTableResource[];
}

/** The tables area: the shop's VE tables, grouped by vehicle, each opening its workspace. */
@Component({
  selector: 'app-tables-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaIntro, MatIconModule, RouterLink],
  template: `
    <div class="cs-page">
      @if (groups(); as list) {
        @if (list.length === 0) {
          <app-area-intro
            title="Tables"
            icon="grid_on"
            emptyTitle="No tables yet"
            emptyText="No vehicle of this shop has a VE table yet."
            [description]="description()"
          />
        } @else {
          <h1 class="cs-page-title">Tables</h1>
          <p class="cs-page-lead">{{ description() }}</p>
          @for (group of list; track group.vehicle.id) {
            <section class="vehicle" [attr.aria-label]="group.vehicle.label">
              <h2 class="vehicle-label">{{ group.vehicle.label }}</h2>
              <ul class="tables">
                @for (table of group.tables; track table.id) {
                  <li>
                    <a class="table-link" [routerLink]="['/tables', table.id]">
                      <mat-icon aria-hidden="true">grid_on</mat-icon>
                      <span class="name">{{ table.name }}</span>
                      <span class="size">
                        {{ table.mapAxisKpa.length }} MAP × {{ table.rpmAxis.length }} RPM
                      </span>
                    </a>
                  </li>
                }
              </ul>
            </section>
          }
        }
      } @else {
        <p class="cs-page-lead">Loading tables…</p>
      }
    </div>
  `,
  styles: `
    .vehicle {
      margin-bottom: 20px;
    }
    .vehicle-label {
      margin: 0 0 8px;
      font: var(--mat-sys-title-medium);
    }
    .tables {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    .table-link {
      display: flex;
      align-items: center;
      gap: 8px;
      padding: 10px 16px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-medium);
      color: var(--mat-sys-on-surface);
      text-decoration: none;
    }
    .table-link:hover,
    .table-link:focus-visible {
      background: var(--mat-sys-surface-container-high);
    }
    .name {
      font: var(--mat-sys-title-small);
    }
    .size {
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class TablesPage {
  private readonly session = inject(Session);
  private readonly vehiclesApi = inject(VehiclesApi);
  private readonly tablesApi = inject(TablesApi);

  /** Vehicles that have tables, with their tables; undefined while loading. */
  protected readonly groups = toSignal(
    this.vehiclesApi.list().pipe(
      // One request per vehicle: fine for a shop's garage until a shop-wide list exists.
      switchMap((vehicles) =>
        vehicles.items.length === 0
          ? of([])
          : forkJoin(
              vehicles.items.map((vehicle) =>
                this.tablesApi
                  .listForVehicle(vehicle.id)
                  .pipe(map((list): VehicleTables => ({ vehicle, tables: list.items }))),
              ),
            ),
      ),
      map((groups) => groups.filter((group) => group.tables.length > 0)),
      // The global error handler already told the user; show the empty state meanwhile.
      catchError(() => of([] as VehicleTables[])),
    ),
  );

  /** What this area does, written for the user's own role. */
  protected readonly description = computed(() =>
    textForRoles(
      this.session.user()?.roles ?? [],
      {
        tuner:
          'The VE tables of your vehicles, indexed by RPM and MAP. Open one to edit cells, run an analysis of the vehicle’s logs, read coverage and lambda error per cell, and apply the proposal as a draft revision.',
        reviewer:
          'The VE tables of the shop’s vehicles. Open one to read its newest revision cell by cell.',
        operator:
          'The VE tables of the shop’s vehicles, to read. Open one to see which cells the logs cover and where they ran lean, so the next session logs what is missing.',
      },
      'The VE tables of the shop’s vehicles and their revisions.',
    ),
  );
}

export default TablesPage;
