import type { Locator, Page } from 'playwright-core';

/** The display preferences as the API stores them. */
export interface StoredPreferences {
  /** metric or imperial. */
  units: string;
  /** lambda or afr. */
  mixture: string;
  /** system, light or dark. */
  theme: string;
}

/** What a member who never chose anything has (and what the demo accounts must end with). */
export const DEFAULT_PREFERENCES: StoredPreferences = {
  units: 'metric',
  mixture: 'lambda',
  theme: 'system',
};

/** Opens the account menu and waits for its preference choices. */
export async function openAccountMenu(page: Page): Promise<Locator> {
  await page.getByRole('button', { name: 'Account' }).click();
  const menu = page.getByRole('menu');
  await menu.getByRole('group', { name: 'Units' }).waitFor();
  return menu;
}

/** Closes the open account menu. */
export async function closeAccountMenu(page: Page): Promise<void> {
  await page.keyboard.press('Escape');
  await page.getByRole('menu').waitFor({ state: 'detached' });
}

/** The radio item of a choice in the account menu's group `group` (e.g. Units, Imperial). */
export function choiceItem(page: Page, group: string, choice: string | RegExp): Locator {
  return page
    .getByRole('menu')
    .getByRole('group', { name: group })
    .getByRole('menuitemradio', { name: choice });
}

/**
 * Picks a choice in the open account menu and waits until the server has stored it (the menu
 * stays open, so several choices can follow).
 */
export async function choose(page: Page, group: string, choice: string | RegExp): Promise<void> {
  const saved = page.waitForResponse(
    (res) => res.url().endsWith('/api/me/preferences') && res.request().method() === 'PATCH',
  );
  await choiceItem(page, group, choice).click();
  const res = await saved;
  if (!res.ok()) throw new Error(`saving the preference answered ${res.status()}`);
  await choiceItem(page, group, choice).and(page.locator('[aria-checked="true"]')).waitFor();
}

/** The signed-in user's stored preferences, read from the API with the page's session. */
export async function storedPreferences(page: Page, baseUrl: string): Promise<StoredPreferences> {
  const res = await page.request.get(`${baseUrl}/api/me/preferences`);
  return (await res.json()) as StoredPreferences;
}

/**
 * Puts the signed-in user's preferences back to the defaults through the API (the demo accounts
 * are shared with other browser tests, which expect metric and lambda).
 */
export async function restoreDefaultPreferences(page: Page, baseUrl: string): Promise<void> {
  const cookies = await page.context().cookies(baseUrl);
  const xsrf = cookies.find((cookie) => cookie.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await page.request.patch(`${baseUrl}/api/me/preferences`, {
    data: DEFAULT_PREFERENCES,
    headers: { 'X-XSRF-TOKEN': decodeURIComponent(xsrf) },
  });
  if (!res.ok()) throw new Error(`restoring the preferences answered ${res.status()}`);
}

/** Waits until the open dialog has finished its opening animation (for a sharp screenshot). */
export async function waitForDialogOpened(page: Page): Promise<void> {
  await page
    .locator('.mat-mdc-dialog-container.mdc-dialog--open:not(.mdc-dialog--opening)')
    .waitFor();
}
