import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { AREA_READERS, AREA_ROLES, type Area } from '@shared/auth/access';
import type { Role } from '@shared/contracts/roles';
import { Session } from '../../core/auth/session';
import { NAV_AREAS } from '../../core/layout/nav-areas';
import { ROLE_LABELS, ROLE_ORDER } from '../../core/layout/role-labels';

/** Role names in form order, joined as words: "Tuner, Operator and Reviewer". */
export function roleList(roles: readonly Role[]): string {
  const names = ROLE_ORDER.filter((role) => roles.includes(role)).map((r) => ROLE_LABELS[r]);
  return names.length <= 1
    ? (names[0] ?? 'no role')
    : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;
}

/**
 * Shown at the address of an area the user's roles cannot open, in place of a silent redirect:
 * it says which roles open the area and which the user holds, and offers the user's first area.
 * The route gives `area` as data.
 */
@Component({
  selector: 'app-no-access-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButtonModule],
  template: `
    <main class="cs-page">
      <h1 class="cs-page-title">Your role cannot open {{ areaLabel() }}</h1>
      <p class="cs-page-lead" data-testid="no-access-reason">
        {{ areaLabel() }} is open to the roles {{ allowed() }}; you are signed in as {{ held() }}.
        An admin of your shop can change your roles on the Team page.
      </p>
      <a mat-flat-button [routerLink]="session.homePath()">Go to your start page</a>
    </main>
  `,
})
export class NoAccessPage {
  /** The session, for the user's roles and start page. */
  protected readonly session = inject(Session);

  /** The area refused (route data). */
  readonly area = input.required<Area>();

  /** The area's name as the navigation writes it. */
  protected readonly areaLabel = computed(() => NAV_AREAS[this.area()].label);
  /** The roles that open the area, to work or to read. */
  protected readonly allowed = computed(() =>
    roleList([...AREA_ROLES[this.area()], ...(AREA_READERS[this.area()] ?? [])]),
  );
  /** The user's own roles. */
  protected readonly held = computed(() => roleList(this.session.user()?.roles ?? []));
}

export default NoAccessPage;
