import { DOCUMENT, Injectable, inject, signal } from '@angular/core';
import type { ThemeChoice } from '@shared/contracts/preferences';

/** The colour schemes a user can choose; `system` follows the operating system. */
export type ColorSchemeChoice = ThemeChoice;

/**
 * The choices in the order the account menu lists them. The same as THEME_CHOICES of
 * `@shared/contracts/preferences`, which cannot be imported here without pulling zod into the
 * client bundle; `theme-preference.spec.ts` checks that the two agree.
 */
export const COLOR_SCHEME_CHOICES: readonly ColorSchemeChoice[] = ['system', 'light', 'dark'];

const STORAGE_KEY = 'cellsmith.color-scheme';
const CLASS_PREFIX = 'cs-scheme-';

/**
 * The colour scheme applied to the page, remembered in localStorage. It is applied as a class on
 * <html> (styles.scss sets `color-scheme` from it) rather than an inline style, which the
 * Content-Security-Policy would not allow. Before anyone signs in (the sign-in page) the
 * remembered choice is used; once signed in, `DisplayPreferences` selects the user's stored one,
 * which is then remembered here for the next sign-in page.
 */
@Injectable({ providedIn: 'root' })
export class ThemePreference {
  private readonly document = inject(DOCUMENT);
  private readonly currentChoice = signal<ColorSchemeChoice>(this.readStored());

  /** The current choice. */
  readonly choice = this.currentChoice.asReadonly();

  constructor() {
    this.apply(this.currentChoice());
  }

  /** Switches to `choice`, applies it and remembers it. */
  select(choice: ColorSchemeChoice): void {
    this.currentChoice.set(choice);
    this.apply(choice);
    try {
      this.document.defaultView?.localStorage.setItem(STORAGE_KEY, choice);
    } catch {
      // Storage can be disabled (private mode, policy); the choice then lasts for this tab only.
    }
  }

  private apply(choice: ColorSchemeChoice): void {
    const classList = this.document.documentElement.classList;
    for (const each of COLOR_SCHEME_CHOICES) classList.remove(CLASS_PREFIX + each);
    if (choice !== 'system') classList.add(CLASS_PREFIX + choice);
  }

  private readStored(): ColorSchemeChoice {
    try {
      const stored = this.document.defaultView?.localStorage.getItem(STORAGE_KEY);
      return COLOR_SCHEME_CHOICES.find((choice) => choice === stored) ?? 'system';
    } catch {
      // Storage can be disabled; fall back to following the system.
      return 'system';
    }
  }
}
