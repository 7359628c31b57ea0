import { demoPassword } from '../../server/seed/demo-shop';
import { signInThroughForm, signOutThroughMenu } from './helpers/auth';
import {
  DEFAULT_PREFERENCES,
  choiceItem,
  choose,
  closeAccountMenu,
  openAccountMenu,
  restoreDefaultPreferences,
  storedPreferences,
  waitForDialogOpened,
} from './helpers/preferences';
import { openVehicle, openVehicles, vehicleFact } from './helpers/vehicles';
import { startRunningApp, type RunningApp } from './support/app-server';
import { launchBrowser, screenshot, type TestBrowser } from './support/browser';

describe('display preferences', () => {
  let app: RunningApp;
  let browser: TestBrowser;

  beforeAll(async () => {
    app = await startRunningApp();
    browser = await launchBrowser('light');
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });

  it('When the demo lead picks imperial, AFR and dark, then they stay after a reload and the vehicle page uses them', async () => {
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, 'lead@cellsmith.test', demoPassword());
    try {
      await openAccountMenu(page);
      await screenshot(page, 'preferences-menu-light');
      await choose(page, 'Units', /Imperial/);
      await choose(page, 'Mixture', /AFR/);
      await choose(page, 'Colour scheme', 'Dark');
      await page.locator('html.cs-scheme-dark').waitFor({ state: 'attached' });
      await screenshot(page, 'preferences-menu-dark');
      await closeAccountMenu(page);

      // Forget what this browser remembers: whatever comes back after the reload is the server's.
      await page.evaluate('window.localStorage.clear()');
      await page.reload();
      await page.getByRole('button', { name: 'Account' }).waitFor();
      await page.locator('html.cs-scheme-dark').waitFor({ state: 'attached' });
      await openAccountMenu(page);
      for (const [group, choice] of [
        ['Units', /Imperial/],
        ['Mixture', /AFR/],
        ['Colour scheme', 'Dark'],
      ] as const) {
        expect(await choiceItem(page, group, choice).getAttribute('aria-checked')).toBe('true');
      }
      await closeAccountMenu(page);
      expect(await storedPreferences(page, app.url)).toEqual({
        units: 'imperial',
        mixture: 'afr',
        theme: 'dark',
      });

      await openVehicles(page);
      await openVehicle(page, 'Demo hatch 1.6T');
      await page
        .getByText(/MAP [\d.]+–[\d.]+ psi\(a\)/)
        .first()
        .waitFor();
      expect(await vehicleFact(page, 'Displacement').textContent()).toMatch(/^\s*[\d.]+ ci\s*$/);
      expect(await vehicleFact(page, 'Injector flow').textContent()).toMatch(/ lb\/h\s*$/);
      expect(await vehicleFact(page, 'Tyre diameter').textContent()).toMatch(/^\s*[\d.]+ in\s*$/);
      expect(await vehicleFact(page, 'Top gear at 1000 rpm').textContent()).toMatch(/ mph\s*$/);
      await screenshot(page, 'vehicle-imperial-dark');

      await page.getByRole('button', { name: 'Edit' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByText('3.1–1220.4 ci').waitFor();
      await waitForDialogOpened(page);
      await screenshot(page, 'vehicle-dialog-imperial-dark');
      await dialog.getByRole('button', { name: 'Cancel' }).click();
      await dialog.waitFor({ state: 'detached' });

      await openAccountMenu(page);
      await choose(page, 'Colour scheme', 'Light');
      await closeAccountMenu(page);
      await page.locator('html.cs-scheme-light').waitFor({ state: 'attached' });
      await screenshot(page, 'vehicle-imperial-light');

      // Back to the defaults through the same menu: other browser tests share this account.
      await openAccountMenu(page);
      await choose(page, 'Units', /Metric/);
      await choose(page, 'Mixture', /Lambda/);
      await choose(page, 'Colour scheme', 'Follow system');
      await closeAccountMenu(page);
      await page
        .getByText(/MAP [\d.]+–[\d.]+ kPa/)
        .first()
        .waitFor();
      expect(await vehicleFact(page, 'Tyre diameter').textContent()).toMatch(/ mm\s*$/);
      expect(await storedPreferences(page, app.url)).toEqual(DEFAULT_PREFERENCES);
    } finally {
      // Even when a step above failed, leave the shared demo account as it was.
      await restoreDefaultPreferences(page, app.url);
    }
    await signOutThroughMenu(page);
    await page.close();
  });

  it('When pages rendered, then the browser reported no CSP violation or script error', () => {
    expect(browser.problems.filter((p) => !/401|Unauthorized/.test(p))).toEqual([]);
  });
});
