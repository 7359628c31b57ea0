import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { Session } from '../../core/auth/session';
import { AreaIntro } from '../../shared/ui/area-intro';
import { textForRoles } from '../../shared/ui/role-text';

/** The tables area. Its records arrive with the tables API; until then it says so honestly. */
@Component({
  selector: 'app-tables-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaIntro],
  template: `
    <div class="cs-page">
      <app-area-intro
        title="Tables"
        icon="grid_on"
        emptyTitle="Table workspace coming next"
        emptyText="Tables, revisions and analyses already work through the API; the table workspace arrives in the next release."
        [description]="description()"
      />
    </div>
  `,
})
export class TablesPage {
  private readonly session = inject(Session);

  /** What this area does, written for the user's own role. */
  protected readonly description = computed(() =>
    textForRoles(
      this.session.user()?.roles ?? [],
      {
        tuner:
          'Tables are the VE tables of your vehicles, indexed by RPM and MAP. Compare each cell with its logged lambda error, apply a proposal by a step fraction, smooth, fill gaps from neighbours and lock the cells you trust, then save a revision.',
        reviewer:
          'Tables are the VE tables of the shop’s vehicles with their revisions. Read coverage, lambda error and spread per cell before a revision goes to review.',
      },
      'Tables are the VE tables of the shop’s vehicles and their revisions.',
    ),
  );
}

export default TablesPage;
