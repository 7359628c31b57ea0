import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { Session } from '../../core/auth/session';
import { AreaIntro } from '../../ui/parts/area-intro';
import { textForRoles } from '../../ui/parts/role-text';

/** The plans area. Its records arrive with the plans API; until then it says so honestly. */
@Component({
  selector: 'app-plans-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaIntro],
  template: `
    <div class="cs-page">
      <app-area-intro
        title="Plans"
        icon="checklist"
        emptyTitle="No session plans yet"
        emptyText="No session plans exist yet. Planning arrives in an upcoming release."
        [description]="description()"
      />
    </div>
  `,
})
export class PlansPage {
  private readonly session = inject(Session);

  /** What this area does, written for the user's own role. */
  protected readonly description = computed(() =>
    textForRoles(
      this.session.user()?.roles ?? [],
      {
        tuner:
          'Session plans list the cells to reach on the next dyno or road session: the ones with too little data or too much spread, ordered as dyno holds or road targets with an estimate of the session time.',
        operator:
          'Session plans list the targets to hold on your next dyno session: hold the RPM, step the load, and check each target off. Follow the shop’s safety rules; full-load work belongs on the dyno, not the road.',
      },
      'Session plans list the cells to reach on the next dyno or road session.',
    ),
  );
}

export default PlansPage;
