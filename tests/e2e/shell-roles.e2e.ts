import { demoPassword } from '../../server/seed/demo-shop';
import { navigationLinks, signInThroughForm, signOutThroughMenu } from './helpers/auth';
import { startRunningApp, type RunningApp } from './support/app-server';
import { launchBrowser, screenshot, type TestBrowser } from './support/browser';

const DEMO = [
  { email: 'admin@cellsmith.test', nav: ['Vehicles', 'Team'] },
  { email: 'tuner@cellsmith.test', nav: ['Vehicles', 'Logs', 'Tables', 'Plans', 'Reviews'] },
  { email: 'operator@cellsmith.test', nav: ['Vehicles', 'Logs', 'Plans'] },
  { email: 'reviewer@cellsmith.test', nav: ['Vehicles', 'Logs', 'Tables', 'Reviews'] },
  { email: 'lead@cellsmith.test', nav: ['Vehicles', 'Logs', 'Tables', 'Plans', 'Reviews'] },
] as const;

describe('the shell for each demo role', () => {
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

  it('When a visitor opens the app, then the sign-in page shows and no CSP rule is broken', async () => {
    const page = await browser.newPage();
    await page.goto(`${app.url}/`);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    await screenshot(page, 'sign-in');
    expect(browser.problems.filter((p) => /Content Security Policy|Refused/i.test(p))).toEqual([]);
    await page.close();
  });

  it.each(DEMO)(
    'When $email signs in, then the navigation shows the areas of their roles',
    async ({ email, nav }) => {
      const page = await browser.newPage();
      await signInThroughForm(page, app.url, email, demoPassword());
      await page.getByRole('navigation').getByRole('link').first().waitFor();
      expect(await navigationLinks(page)).toEqual(nav);
      await screenshot(page, `shell-${email.split('@')[0]}`);
      await signOutThroughMenu(page);
      await page.close();
    },
  );

  it('When an unknown path is opened, then the not-found page shows', async () => {
    const page = await browser.newPage();
    await page.goto(`${app.url}/no/such/page`);
    await page
      .getByText(/not found/i)
      .first()
      .waitFor();
    await screenshot(page, 'not-found');
    await page.close();
  });

  it('When pages rendered, then the browser reported no CSP violation or script error', () => {
    expect(browser.problems.filter((p) => !/401|Unauthorized/.test(p))).toEqual([]);
  });
});
