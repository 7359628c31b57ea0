import { BreakpointObserver } from '@angular/cdk/layout';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ErrorHandler,
  computed,
  inject,
} from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatMenuModule } from '@angular/material/menu';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import type { UpdateDisplayPreferencesRequest } from '@shared/contracts/preferences';
import { Session } from '../auth/session';
import { DisplayPreferences } from '../preferences/display-preferences';
import { MIXTURE_OPTIONS, THEME_OPTIONS, UNIT_OPTIONS } from '../preferences/preference-options';
import { NAV_AREAS } from './nav-areas';
import { ROLE_LABELS } from './role-labels';

/** Below this width the navigation slides over the page instead of sitting beside it. */
const NARROW_QUERY = '(max-width: 899.98px)';

/** The frame of every signed-in page: toolbar, side navigation by role, and the routed page. */
@Component({
  selector: 'app-shell',
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatToolbarModule,
    MatSidenavModule,
    MatListModule,
    MatIconModule,
    MatButtonModule,
    MatMenuModule,
    MatDividerModule,
  ],
})
export class Shell {
  private readonly session = inject(Session);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  private readonly displayPreferences = inject(DisplayPreferences);
  private readonly errorHandler = inject(ErrorHandler);

  /** Whether the screen is narrow enough that the navigation overlays the page. */
  protected readonly isNarrow = toSignal(
    inject(BreakpointObserver)
      .observe(NARROW_QUERY)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );

  /** The signed-in user (the route guard guarantees one while this shell is shown). */
  protected readonly user = this.session.user;

  /** Navigation entries the user's roles allow, in product order. */
  protected readonly navItems = computed(() =>
    this.session.areas().map((area) => ({ area, path: `/${area}`, ...NAV_AREAS[area] })),
  );

  /** The user's roles as display text. */
  protected readonly roleText = computed(() =>
    (this.user()?.roles ?? []).map((role) => ROLE_LABELS[role]).join(', '),
  );

  /** The unit systems offered in the account menu. */
  protected readonly unitOptions = UNIT_OPTIONS;
  /** The mixture displays offered. */
  protected readonly mixtureOptions = MIXTURE_OPTIONS;
  /** The colour schemes offered. */
  protected readonly themeOptions = THEME_OPTIONS;

  /** The user's display preferences in effect. */
  protected readonly preferences = this.displayPreferences.preferences;

  /**
   * Applies a choice from the account menu. The menu stays open (the click does not reach the
   * panel, which would close it) so all three preferences can be set in one visit.
   */
  protected choose(event: Event, change: UpdateDisplayPreferencesRequest): void {
    event.stopPropagation();
    this.displayPreferences.change(change);
  }

  /** Ends the session and goes to the sign-in page (also when the server could not be told). */
  protected signOut(): void {
    const toSignIn = (): void => void this.router.navigateByUrl('/sign-in');
    this.session
      .signOut()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        complete: toSignIn,
        error: (error: unknown) => {
          this.errorHandler.handleError(error);
          toSignIn();
        },
      });
  }
}
