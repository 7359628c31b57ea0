import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { Session } from '../../core/auth/session';
import { AreaIntro } from '../../ui/parts/area-intro';
import { textForRoles } from '../../ui/parts/role-text';

/** The reviews area. Its records arrive with the reviews API; until then it says so honestly. */
@Component({
  selector: 'app-reviews-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaIntro],
  template: `
    <div class="cs-page">
      <app-area-intro
        title="Reviews"
        icon="fact_check"
        emptyTitle="Nothing to review"
        emptyText="No revisions are waiting for review. Reviews arrive in an upcoming release."
        [description]="description()"
      />
    </div>
  `,
})
export class ReviewsPage {
  private readonly session = inject(Session);

  /** What this area does, written for the user's own role. */
  protected readonly description = computed(() =>
    textForRoles(
      this.session.user()?.roles ?? [],
      {
        reviewer:
          'Reviews are the revisions waiting for your decision. Compare any two revisions side by side with a difference grid, comment on the revision or on single cells, then approve it or send it back. You cannot approve a revision you authored.',
        tuner:
          'Reviews show the revisions you sent for approval, with the reviewer’s comments per revision and per cell, and whether each was approved or sent back.',
      },
      'Reviews are where revisions are compared, discussed and approved before they go onto a customer’s car.',
    ),
  );
}

export default ReviewsPage;
