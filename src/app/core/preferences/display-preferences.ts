import {
  ErrorHandler,
  Injectable,
  computed,
  effect,
  inject,
  linkedSignal,
  untracked,
} from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type {
  DisplayPreferenceValues,
  UpdateDisplayPreferencesRequest,
} from '@shared/contracts/preferences';
import { Subject, catchError, concatMap, map, of } from 'rxjs';
import { apiErrorMessage, isHttpStatus } from '../api/api-error';
import { PreferencesApi } from '../api/preferences-api';
import { Session } from '../auth/session';
import { ThemePreference } from '../theme/theme-preference';
import { DEFAULT_PREFERENCES, PREFERENCE_NAMES } from './preference-options';
import { Notifier } from '../notify/notifier';

/** One preference name. */
type PreferenceKey = keyof DisplayPreferenceValues;

/** A change shown at once and waiting for the server, numbered so answers settle their own. */
interface PendingValue<K extends PreferenceKey> {
  /** The value shown meanwhile. */
  value: DisplayPreferenceValues[K];
  /** The number of the request that carries it. */
  request: number;
}

/** Changes waiting for the server, per preference. */
type Pending = { [K in PreferenceKey]?: PendingValue<K> };

/** A change on its way to the server. */
interface QueuedChange {
  /** The user it was made for (answers for another user are dropped). */
  userId: string;
  /** The fields changed. */
  change: UpdateDisplayPreferencesRequest;
  /** Its number. */
  request: number;
}

/**
 * The signed-in user's display preferences (units, mixture display, colour scheme), kept on the
 * server so they follow the user to any browser. Loaded when someone signs in, back to the
 * defaults at sign-out. A change shows at once and is saved in the background; if the server
 * refuses it, the previous choice comes back and a snackbar says why. Changes are sent one after
 * another, so the last answer is always the server's latest state.
 *
 * The colour scheme goes through {@link ThemePreference}: before sign-in its remembered choice
 * applies (the sign-in page), after sign-in the server's value wins.
 */
@Injectable({ providedIn: 'root' })
export class DisplayPreferences {
  private readonly api = inject(PreferencesApi);
  private readonly session = inject(Session);
  private readonly themePreference = inject(ThemePreference);
  private readonly notifier = inject(Notifier);
  private readonly errorHandler = inject(ErrorHandler);

  private readonly userId = computed(() => this.session.user()?.id);
  private readonly queue = new Subject<QueuedChange>();
  private requestCount = 0;

  /** The signed-in user's stored preferences, fetched once per sign-in; idle when signed out. */
  private readonly stored = rxResource({
    params: () => this.userId(),
    stream: () => this.api.get(),
  });

  /** What the server last said for this user; null until it has (and when signed out). */
  private readonly confirmed = linkedSignal<DisplayPreferenceValues | null>(() =>
    this.stored.hasValue() ? this.stored.value() : null,
  );

  /** Changes shown but not yet answered; forgotten when another user signs in. */
  private readonly pending = linkedSignal<string | undefined, Pending>({
    source: this.userId,
    computation: () => ({}),
  });

  /**
   * The preferences in effect: pending changes over the server's values over the defaults.
   * Until the server has answered, the colour scheme is the one already applied to the page.
   */
  readonly preferences = computed<DisplayPreferenceValues>(() => {
    const pending = this.pending();
    const base = this.confirmed() ?? {
      ...DEFAULT_PREFERENCES,
      theme: this.themePreference.choice(),
    };
    return {
      units: pending.units?.value ?? base.units,
      mixture: pending.mixture?.value ?? base.mixture,
      theme: pending.theme?.value ?? base.theme,
    };
  });

  /** Metric or imperial units. */
  readonly units = computed(() => this.preferences().units);
  /** Lambda or AFR. */
  readonly mixture = computed(() => this.preferences().mixture);
  /** The colour-scheme choice. */
  readonly theme = computed(() => this.preferences().theme);
  /** Whether the server's stored preferences have arrived for the signed-in user. */
  readonly loaded = computed(() => this.confirmed() !== null);

  constructor() {
    this.queue
      .pipe(
        concatMap((queued) =>
          this.api.update(queued.change).pipe(
            map((answer) => ({ queued, answer, error: null })),
            // A refusal must not end the queue: it is reported and the next change still goes.
            catchError((error: unknown) => of({ queued, answer: null, error })),
          ),
        ),
        takeUntilDestroyed(),
      )
      .subscribe(({ queued, answer, error }) => this.settle(queued, answer, error));

    // The server's (or a pending) colour scheme wins over the one remembered in this browser.
    effect(() => {
      if (!this.loaded() && this.pending().theme === undefined) return;
      const theme = this.theme();
      untracked(() => {
        if (this.themePreference.choice() !== theme) this.themePreference.select(theme);
      });
    });

    // A failed load leaves the defaults in place; say so (a 401 is the sign-in redirect's job).
    effect(() => {
      const error = this.stored.error();
      if (error !== undefined && !isHttpStatus(error, 401)) {
        untracked(() => this.errorHandler.handleError(error));
      }
    });
  }

  /**
   * Changes some preferences: shown at once, saved in the background. Signed out (the sign-in
   * page), only the colour scheme applies, and only in this browser.
   */
  change(change: UpdateDisplayPreferencesRequest): void {
    const userId = this.userId();
    if (userId === undefined) {
      if (change.theme !== undefined) this.themePreference.select(change.theme);
      return;
    }
    const request = ++this.requestCount;
    this.pending.update((pending) => {
      const next: Pending = { ...pending };
      if (change.units !== undefined) next.units = { value: change.units, request };
      if (change.mixture !== undefined) next.mixture = { value: change.mixture, request };
      if (change.theme !== undefined) next.theme = { value: change.theme, request };
      return next;
    });
    this.queue.next({ userId, change, request });
  }

  /** Asks the server again (e.g. after a failed load). */
  reload(): void {
    this.stored.reload();
  }

  /** Takes an answer in: the server's state becomes the base, this request's changes settle. */
  private settle(
    queued: QueuedChange,
    answer: DisplayPreferenceValues | null,
    error: unknown,
  ): void {
    if (this.userId() !== queued.userId) return;
    if (answer !== null) this.confirmed.set(answer);
    this.pending.update((pending) => {
      const next: Pending = { ...pending };
      for (const key of Object.keys(queued.change) as PreferenceKey[]) {
        if (next[key]?.request === queued.request) delete next[key];
      }
      return next;
    });
    if (answer === null) {
      const names = (Object.keys(queued.change) as PreferenceKey[])
        .map((key) => PREFERENCE_NAMES[key])
        .join(', ');
      const reason = apiErrorMessage(error, 'The request failed.');
      this.notifier.failure(`Your ${names} could not be saved: ${reason}`);
    }
  }
}
