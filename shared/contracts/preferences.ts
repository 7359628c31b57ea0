import { z } from 'zod';

/** How quantities are shown: SI-style metric units, or US customary (imperial) units. */
export const UNIT_SYSTEMS = ['metric', 'imperial'] as const;
/** One unit system. */
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/** How mixture is shown: lambda, or air-fuel ratio on the vehicle's stoichiometric scale. */
export const MIXTURE_DISPLAYS = ['lambda', 'afr'] as const;
/** One mixture display. */
export type MixtureDisplay = (typeof MIXTURE_DISPLAYS)[number];

/** Colour scheme of the app; `system` follows the operating system. */
export const THEME_CHOICES = ['system', 'light', 'dark'] as const;
/** One colour-scheme choice. */
export type ThemeChoice = (typeof THEME_CHOICES)[number];

const unitsSchema = z.enum(UNIT_SYSTEMS, {
  error: `units must be one of ${UNIT_SYSTEMS.join(', ')}`,
});
const mixtureSchema = z.enum(MIXTURE_DISPLAYS, {
  error: `mixture must be one of ${MIXTURE_DISPLAYS.join(', ')}`,
});
const themeSchema = z.enum(THEME_CHOICES, {
  error: `theme must be one of ${THEME_CHOICES.join(', ')}`,
});

/**
 * A user's display preferences, the answer of `GET` and `PATCH /api/me/preferences`. They only
 * change how the client shows values; the API itself always speaks metric and lambda.
 */
export const displayPreferencesSchema = z
  .object({ units: unitsSchema, mixture: mixtureSchema, theme: themeSchema })
  .strict();

/** A user's display preferences. */
export type DisplayPreferenceValues = z.infer<typeof displayPreferencesSchema>;

/** What a user who never chose anything gets (and what the database column defaults to). */
export const DEFAULT_DISPLAY_PREFERENCES: Readonly<DisplayPreferenceValues> = Object.freeze({
  units: 'metric',
  mixture: 'lambda',
  theme: 'system',
});

/**
 * Body of `PATCH /api/me/preferences`: any subset of the preferences (at least one), laid over
 * the stored ones. An unknown field is refused rather than ignored, so a typo is noticed.
 */
export const updateDisplayPreferencesSchema = displayPreferencesSchema
  .partial()
  .strict()
  .refine((body) => Object.values(body).some((value) => value !== undefined), {
    message: `give at least one of ${Object.keys(DEFAULT_DISPLAY_PREFERENCES).join(', ')}`,
  });

/** Body of `PATCH /api/me/preferences`. */
export type UpdateDisplayPreferencesRequest = z.infer<typeof updateDisplayPreferencesSchema>;

/**
 * Reads preferences as stored: a field that is missing or no longer valid (a choice removed in
 * a later version, a hand-edited row) falls back to its default instead of failing the request,
 * and so does anything that is not an object at all. Unknown fields are dropped.
 */
export const storedDisplayPreferencesSchema = z
  .object({
    units: unitsSchema.catch(DEFAULT_DISPLAY_PREFERENCES.units),
    mixture: mixtureSchema.catch(DEFAULT_DISPLAY_PREFERENCES.mixture),
    theme: themeSchema.catch(DEFAULT_DISPLAY_PREFERENCES.theme),
  })
  .catch(() => ({ ...DEFAULT_DISPLAY_PREFERENCES }));
