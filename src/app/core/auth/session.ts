import { ErrorHandler, Injectable, computed, inject, signal } from '@angular/core';
import { type Observable, finalize, firstValueFrom, map, tap } from 'rxjs';
import type { SessionUser } from '@shared/contracts/auth';
import { type Area, areasFor } from '@shared/auth/access';
import { AuthApi } from '../api/auth-api';
import { isHttpStatus } from '../api/api-error';

/** The signed-in user of this browser tab, as the server last reported it. */
@Injectable({ providedIn: 'root' })
export class Session {
  private readonly authApi = inject(AuthApi);
  private readonly errorHandler = inject(ErrorHandler);

  private readonly currentUser = signal<SessionUser | null>(null);
  private readonly isLoadedState = signal(false);
  /** The first `/api/auth/me` call, shared by every guard that waits for it. */
  private firstLoad: Promise<SessionUser | null> | null = null;

  /** The signed-in user, or null. */
  readonly user = this.currentUser.asReadonly();

  /** Whether the server has been asked at least once who is signed in. */
  readonly loaded = this.isLoadedState.asReadonly();

  /** The areas the user's roles give work in, in navigation order. */
  readonly areas = computed<Area[]>(() => areasFor(this.currentUser()?.roles ?? []));

  /** The first page a user should land on: their first area, or sign-in. */
  readonly homePath = computed(() => {
    const first = this.areas()[0];
    return first === undefined ? '/sign-in' : `/${first}`;
  });

  /** Resolves once the session is known: the first `/me` answer, or the current user. */
  whenLoaded(): Promise<SessionUser | null> {
    if (this.isLoadedState()) return Promise.resolve(this.currentUser());
    this.firstLoad ??= this.refresh();
    return this.firstLoad;
  }

  /** Asks the server who is signed in; a 401 means nobody. */
  async refresh(): Promise<SessionUser | null> {
    try {
      const { user } = await firstValueFrom(this.authApi.me());
      this.currentUser.set(user);
    } catch (error) {
      this.currentUser.set(null);
      // Anything but 401 is a real fault; report it, and treat the tab as signed out so the
      // sign-in page (which shows its own errors) is where the user lands.
      if (!isHttpStatus(error, 401)) this.errorHandler.handleError(error);
    } finally {
      this.isLoadedState.set(true);
    }
    return this.currentUser();
  }

  /** Signs in; errors (401 wrong credentials, 429 throttled) reach the caller. */
  signIn(email: string, password: string): Observable<SessionUser> {
    return this.authApi.login({ email, password }).pipe(
      map((response) => response.user),
      tap((user) => {
        this.currentUser.set(user);
        this.isLoadedState.set(true);
      }),
    );
  }

  /**
   * Ends the session on the server and forgets the user here, even when the request fails:
   * a tab that keeps showing someone after they chose to leave would be worse.
   */
  signOut(): Observable<void> {
    return this.authApi.logout().pipe(finalize(() => this.clear()));
  }

  /** Forgets the user without asking the server (used when the server already said 401). */
  clear(): void {
    this.currentUser.set(null);
    this.isLoadedState.set(true);
  }
}
