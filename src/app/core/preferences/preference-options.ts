import type {
  DisplayPreferenceValues,
  MixtureDisplay,
  ThemeChoice,
  UnitSystem,
} from '@shared/contracts/preferences';

/**
 * What a user who never chose anything gets. The same as DEFAULT_DISPLAY_PREFERENCES of
 * `@shared/contracts/preferences`, which cannot be imported here without pulling zod into the
 * client bundle; `preference-options.spec.ts` checks that the two agree.
 */
export const DEFAULT_PREFERENCES: Readonly<DisplayPreferenceValues> = Object.freeze({
  units: 'metric',
  mixture: 'lambda',
  theme: 'system',
});

/** One choice as the account menu lists it. */
export interface PreferenceOption<T extends string> {
  /** The stored value. */
  value: T;
  /** Menu text. */
  label: string;
}

/** Unit systems in menu order; the label says which units each brings. */
export const UNIT_OPTIONS: readonly PreferenceOption<UnitSystem>[] = [
  { value: 'metric', label: 'Metric (kPa, °C, L, mm)' },
  { value: 'imperial', label: 'Imperial (psi, °F, ci, in)' },
];

/** Mixture displays in menu order. */
export const MIXTURE_OPTIONS: readonly PreferenceOption<MixtureDisplay>[] = [
  { value: 'lambda', label: 'Lambda (λ)' },
  { value: 'afr', label: 'Air-fuel ratio (AFR)' },
];

/** Colour schemes in menu order. */
export const THEME_OPTIONS: readonly PreferenceOption<ThemeChoice>[] = [
  { value: 'system', label: 'Follow system' },
  { value: 'light', label: 'Light' },
  { value: 'dark', label: 'Dark' },
];

/** How each preference is named in messages. */
export const PREFERENCE_NAMES: Readonly<Record<keyof DisplayPreferenceValues, string>> = {
  units: 'units',
  mixture: 'mixture display',
  theme: 'colour scheme',
};
