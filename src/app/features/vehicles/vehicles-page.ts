import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { Session } from '../../core/auth/session';
import { AreaIntro } from '../../shared/ui/area-intro';
import { textForRoles } from '../../shared/ui/role-text';

/** The vehicles area. Its records arrive with the vehicles API; until then it says so honestly. */
@Component({
  selector: 'app-vehicles-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaIntro],
  template: `
    <div class="cs-page">
      <app-area-intro
        title="Vehicles"
        icon="directions_car"
        emptyTitle="No vehicles yet"
        emptyText="This shop has no vehicles on record. Adding vehicles arrives in an upcoming release."
        [description]="description()"
      />
    </div>
  `,
})
export class VehiclesPage {
  private readonly session = inject(Session);

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
