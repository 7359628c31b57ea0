import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { Session } from '../../core/auth/session';
import { AreaIntro } from '../../shared/ui/area-intro';
import { textForRoles } from '../../shared/ui/role-text';

/** The logs area. Its records arrive with the logs API; until then it says so honestly. */
@Component({
  selector: 'app-logs-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaIntro],
  template: `
    <div class="cs-page">
      <app-area-intro
        title="Logs"
        icon="monitoring"
        emptyTitle="Log list coming next"
        emptyText="Logs are already uploaded and parsed through the API; this page will list them and take uploads in the next release."
        [description]="description()"
      />
    </div>
  `,
})
export class LogsPage {
  private readonly session = inject(Session);

  /** What this area does, written for the user's own role. */
  protected readonly description = computed(() =>
    textForRoles(
      this.session.user()?.roles ?? [],
      {
        tuner:
          'Logs are the wideband recordings of drives and dyno runs. Import a CSV from any logger, map its columns once, and Cellsmith aligns, filters and accumulates it cell by cell into a proposal for the table.',
        operator:
          'Logs are the recordings of the sessions you run. Upload the files after each session; targets of the plan are ticked off as the new data reaches them.',
      },
      'Logs are the wideband recordings behind every table revision: which cells were reached, how far measured lambda sat from commanded, and where the mixture went lean.',
    ),
  );
}

export default LogsPage;
