import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  signal,
} from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import type { Vehicle } from '@shared/contracts/vehicles';
import { debounceTime, distinctUntilChanged, map } from 'rxjs';
import { apiErrorMessage } from '../../core/api/api-error';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { Session } from '../../core/auth/session';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { textForRoles } from '../../ui/parts/role-text';
import { VehicleDialog, type VehicleDialogData } from './vehicle-dialog';
import {
  INITIAL_LIST_STATE,
  MAX_SEARCH_LENGTH,
  PAGE_SIZES,
  type VehicleListState,
  sortFromHeader,
  vehicleListQuery,
} from './vehicle-list-query';
import { canEditVehicles } from './vehicle-roles';
import { engineSummary, fuelSummary, gearingSummary } from './vehicle-summary';

/** How long the search waits after the last key before asking the server. */
const SEARCH_DEBOUNCE_MS = 300;

/**
 * The vehicles area: the shop's vehicles, searched, sorted and paged on the server, each row
 * leading to the vehicle's page; tuners and admins can add one.
 */
@Component({
  selector: 'app-vehicles-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
  ],
  templateUrl: './vehicles-page.html',
  styleUrl: './vehicles-page.scss',
})
export class VehiclesPage {
  private readonly session = inject(Session);
  private readonly api = inject(VehiclesApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  private readonly displayPreferences = inject(DisplayPreferences);

  private readonly listState = signal<VehicleListState>(INITIAL_LIST_STATE);

  /** Search, sort and page of the list. */
  protected readonly state = this.listState.asReadonly();

  /** Columns of the table, in order. */
  protected readonly columns = ['label', 'engine', 'fuel', 'gearing', 'createdAt'];

  /** Page sizes offered. */
  protected readonly pageSizes = [...PAGE_SIZES];

  /** The longest search accepted. */
  protected readonly maxSearchLength = MAX_SEARCH_LENGTH;

  /** The search box. */
  protected readonly search = new FormControl('', { nonNullable: true });

  /** The current page of matches, refetched whenever the search, sort or page changes. */
  protected readonly page = rxResource({
    params: () => vehicleListQuery(this.listState()),
    stream: ({ params }) => this.api.list(params),
  });

  /** The vehicles of the page shown (the previous page stays while the next one loads). */
  protected readonly rows = computed<Vehicle[]>(() =>
    this.page.hasValue() ? this.page.value().items : [],
  );

  /** How many vehicles match in all. */
  protected readonly total = computed(() => (this.page.hasValue() ? this.page.value().total : 0));

  /** Why the list could not be read, if it could not. */
  protected readonly loadError = computed(() => {
    const error = this.page.error();
    return error === undefined ? null : apiErrorMessage(error, 'The vehicles could not be loaded.');
  });

  /** Whether the signed-in member may add vehicles. */
  protected readonly canCreate = computed(() => canEditVehicles(this.session.user()?.roles ?? []));

  /** One line on the engine, in the user's units. */
  protected engine(vehicle: Vehicle): string {
    return engineSummary(vehicle, this.displayPreferences.units());
  }

  /** The fuel and its ratio. */
  protected readonly fuel = fuelSummary;

  /** The gearing, in the user's units. */
  protected gearing(vehicle: Vehicle): string {
    return gearingSummary(vehicle, this.displayPreferences.units());
  }

  /** Keeps rows in place across reloads. */
  protected readonly trackById = (_index: number, vehicle: Vehicle): string => vehicle.id;

  /** What this area does, written for the user's own role. */
  protected readonly description = computed(() =>
    textForRoles(
      this.session.user()?.roles ?? [],
      {
        operator:
          'Vehicles are the cars your shop calibrates. Open one to see its tables and the logs already recorded.',
        reviewer:
          'Vehicles are the cars your shop calibrates. Each one carries its engine facts, its VE table revisions and the logs behind them, so you can read the whole history before approving a change.',
        admin:
          'Vehicles are the cars your shop calibrates, each with its engine facts, tables and logs.',
      },
      'Each vehicle holds the engine facts the fuelling model needs (displacement, injectors, fuel, gearing), its VE table revisions and the logs recorded on it. Start here after a hardware change.',
    ),
  );

  constructor() {
    this.search.valueChanges
      .pipe(
        debounceTime(SEARCH_DEBOUNCE_MS),
        map((text) => text.trim()),
        distinctUntilChanged(),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((search) => this.listState.update((s) => ({ ...s, search, pageIndex: 0 })));
  }

  /** Applies a header click: a new sort starts again at the first page. */
  protected changeSort(sort: Sort): void {
    const next = sortFromHeader(sort.active, sort.direction);
    this.listState.update((s) => ({ ...s, ...next, pageIndex: 0 }));
  }

  /** Applies a paginator move or a new page size. */
  protected changePage(event: PageEvent): void {
    this.listState.update((s) => ({ ...s, pageIndex: event.pageIndex, pageSize: event.pageSize }));
  }

  /** Opens a vehicle's page. */
  protected openVehicle(vehicle: Vehicle): void {
    void this.router.navigate(['/vehicles', vehicle.id]);
  }

  /** Opens the new-vehicle dialog; a created vehicle opens at once. */
  protected openCreateDialog(): void {
    this.dialog
      .open<VehicleDialog, VehicleDialogData, Vehicle>(VehicleDialog, {
        data: { vehicle: null },
        autoFocus: 'first-tabbable',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((vehicle) => {
        if (vehicle !== undefined) this.openVehicle(vehicle);
      });
  }
}

export default VehiclesPage;
