import { demoPassword } from '../../db/seed/demo-shop';
import { signInThroughForm, signOutThroughMenu } from './helpers/auth';
import { logRows, openLogs, snakeCsv, uploadLog } from './helpers/logs';
import { startRunningApp, type RunningApp } from './support/app-server';
import { launchBrowser, screenshot, type TestBrowser } from './support/browser';

describe('the logs area', () => {
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

  it('When the demo tuner uploads a CSV, then it is parsed and its page shows its figures', async () => {
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, 'tuner@cellsmith.test', demoPassword());
    await openLogs(page);
    await logRows(page).first().waitFor();
    await screenshot(page, 'logs-list');

    const run = Date.now();
    const file = snakeCsv(`e2e-road-${run}.csv`, (run % 100_000) / 10);
    await uploadLog(page, 'Demo hatch 1.6T', file);
    const upload = page.getByRole('region', { name: 'Upload log' });
    await upload.getByText(`${file.name} is ready.`).waitFor({ timeout: 30_000 });
    await logRows(page).filter({ hasText: file.name }).getByText('Ready').waitFor();
    await screenshot(page, 'logs-uploaded');

    await upload.getByRole('link', { name: 'Open the log' }).click();
    await page.getByRole('heading', { name: file.name, level: 1 }).waitFor();
    await page.getByRole('link', { name: 'Demo hatch 1.6T' }).waitFor();
    await page.getByRole('rowheader', { name: 'lambdaTarget' }).waitFor();
    expect(await page.locator('dt', { hasText: 'Rows kept' }).count()).toBe(1);
    await page.getByText('No time-series chart yet', { exact: false }).waitFor();
    await screenshot(page, 'log-detail');
    await signOutThroughMenu(page);
    await page.close();
  });

  it('When the file has no commanded-lambda column, then the missing channel is named', async () => {
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, 'tuner@cellsmith.test', demoPassword());
    await openLogs(page);
    const run = Date.now();
    const file = snakeCsv(`e2e-no-target-${run}.csv`, (run % 100_000) / 10, {
      lambdaTarget: false,
    });
    await uploadLog(page, 'Demo hatch 1.6T', file);
    const alert = page.getByRole('alert').filter({ hasText: 'No column found for:' });
    await alert.waitFor();
    expect(await alert.textContent()).toContain('lambdaTarget');
    await screenshot(page, 'logs-upload-422');
    await signOutThroughMenu(page);
    await page.close();
  });

  it('When pages rendered, then the browser reported no CSP violation or script error', () => {
    expect(browser.problems.filter((p) => !/401|Unauthorized|422/.test(p))).toEqual([]);
  });
});
