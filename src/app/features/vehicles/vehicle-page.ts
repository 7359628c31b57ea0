import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { canReadArea, hasAnyRole } from '@shared/auth/access';
import type { RevisionSummary, VeTableResource } from '@shared/contracts/tables';
import type { Vehicle } from '@shared/contracts/vehicles';
import { forkJoin, map, of } from 'rxjs';
import { apiErrorMessage, isHttpStatus } from '../../core/api/api-error';
import { LogsApi } from '../../core/api/logs-api';
import { TablesApi } from '../../core/api/tables-api';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { Session } from '../../core/auth/session';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { QuantityPipe } from '../../ui/units/quantity-pipe';
import { VehicleDialog, type VehicleDialogData } from './vehicle-dialog';
import { FUEL_LABELS } from './vehicle-form';
import { NewTableDialog, type NewTableDialogData } from './new-table/new-table-dialog';
import { VehicleLogs } from './vehicle-logs';
import { canEditVehicles } from './vehicle-roles';
import { topGearSpeedText } from './vehicle-summary';
import { VehicleTableCards } from './vehicle-table-cards';

/**
 * One vehicle: its engine, fuel and gearing (in the user's units), its VE tables with their
 * latest revisions, its logs.
 */
@Component({
  selector: 'app-vehicle-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterLink,
    MatButtonModule,
    MatCardModule,
    MatIconModule,
    MatProgressBarModule,
    VehicleLogs,
    VehicleTableCards,
    QuantityPipe,
  ],
  templateUrl: './vehicle-page.html',
  styleUrl: './vehicle-page.scss',
})
export class VehiclePage {
  private readonly api = inject(VehiclesApi);
  private readonly tablesApi = inject(TablesApi);
  private readonly logsApi = inject(LogsApi);
  private readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly displayPreferences = inject(DisplayPreferences);

  /** The vehicle's id, from the route. */
  readonly id = input.required<string>();

  /** The vehicle. */
  protected readonly vehicle = rxResource({
    params: () => this.id(),
    stream: ({ params }) => this.api.get(params),
  });

  /** Its VE tables, oldest first. */
  protected readonly tables = rxResource({
    params: () => this.id(),
    stream: ({ params }) => this.tablesApi.listForVehicle(params).pipe(map((res) => res.items)),
    defaultValue: [],
  });

  /** Its logs, newest first. */
  protected readonly logs = rxResource({
    params: () => this.id(),
    stream: ({ params }) => this.logsApi.listForVehicle(params).pipe(map((res) => res.items)),
    defaultValue: [],
  });

  /** Each table's revisions by table id, fetched once the tables are known. */
  protected readonly revisions = rxResource({
    params: () => this.tables.value().map((table) => table.id),
    stream: ({ params }) =>
      params.length === 0
        ? of({})
        : forkJoin(
            params.map((tableId) =>
              this.tablesApi
                .revisions(tableId)
                .pipe(map((res) => [tableId, res.items] as [string, RevisionSummary[]])),
            ),
          ).pipe(map((pairs) => Object.fromEntries(pairs))),
    defaultValue: {} as Readonly<Record<string, RevisionSummary[]>>,
  });

  /** "Table name r3" for every revision of the vehicle's tables, by revision id. */
  protected readonly revisionLabels = computed(() => {
    const labels: Record<string, string> = {};
    const byTable: Readonly<Record<string, RevisionSummary[]>> = this.revisions.value();
    for (const table of this.tables.value()) {
      for (const revision of byTable[table.id] ?? []) {
        labels[revision.id] = `${table.name} r${revision.number}`;
      }
    }
    return labels;
  });

  /** Whether the vehicle does not exist in this shop. */
  protected readonly isMissing = computed(() => isHttpStatus(this.vehicle.error(), 404));

  /** Why something could not be read, other than a missing vehicle. */
  protected readonly loadError = computed(() => {
    const error = this.vehicle.error() ?? this.tables.error() ?? this.logs.error();
    if (error === undefined || isHttpStatus(error, 404)) return null;
    return apiErrorMessage(error, 'This vehicle could not be loaded.');
  });

  /** Whether the signed-in member may change the vehicle. */
  protected readonly canEdit = computed(() => canEditVehicles(this.session.user()?.roles ?? []));

  /** Whether the member may open the table workspace (operators read it). */
  protected readonly canOpenTables = computed(() =>
    canReadArea(this.session.user()?.roles ?? [], 'tables'),
  );

  /** Fuel names. */
  protected readonly fuelLabels = FUEL_LABELS;

  /** Road speed per 1000 rpm in top gear, in the user's units. */
  protected topGearSpeed(vehicle: Vehicle): string | null {
    return topGearSpeedText(vehicle, this.displayPreferences.units());
  }

  /** Opens the dialog on the vehicle; the saved vehicle replaces the one shown. */
  protected openEditDialog(vehicle: Vehicle): void {
    this.dialog
      .open<VehicleDialog, VehicleDialogData, Vehicle>(VehicleDialog, {
        data: { vehicle },
        autoFocus: 'first-tabbable',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((saved) => {
        if (saved !== undefined) this.vehicle.set(saved);
      });
  }

  /** Whether the user may add tables (the server lets tuners create them). */
  protected readonly canAddTables = computed(() =>
    hasAnyRole(this.session.user()?.roles ?? [], ['tuner']),
  );

  /** Opens the new-table dialog; a created table opens in the workspace. */
  protected openNewTableDialog(vehicle: Vehicle): void {
    this.dialog
      .open<NewTableDialog, NewTableDialogData, VeTableResource>(NewTableDialog, {
        data: { vehicleId: vehicle.id, vehicleLabel: vehicle.label },
        autoFocus: 'first-tabbable',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((table) => {
        if (table !== undefined) void this.router.navigate(['/tables', table.id]);
      });
  }

  /** Reads the logs again (their parse state moves on the server). */
  protected reloadLogs(): void {
    this.logs.reload();
  }
}

export default VehiclePage;
