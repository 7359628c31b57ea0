import { demoPassword } from '../../server/seed/demo-shop';
import { signInThroughForm, signOutThroughMenu } from './helpers/auth';
import {
  fillUpload,
  logRows,
  mapColumn,
  mappingDialog,
  oddHeaderCsv,
  openLogs,
  snakeCsv,
  uploadArea,
  uploadLog,
  waitForLogChart,
  waitForMappingDialog,
  zoomLogChart,
} from './helpers/logs';
import { startRunningApp, type RunningApp } from './support/app-server';
import { browserPool, screenshot } from './support/browser';

const VEHICLE = 'Demo hatch 1.6T';

describe('the logs area', () => {
  let app: RunningApp;
  const browsers = browserPool();
  /** A fresh browser in `scheme`, closed after all tests. */
  const openBrowser = browsers.launch;

  beforeAll(async () => {
    app = await startRunningApp();
  });
  afterAll(async () => {
    await browsers.closeAll();
    await app?.close();
  });

  it('When the demo tuner uploads a CSV with known columns, then it goes straight through and its page charts it', async () => {
    const page = await (await openBrowser('light')).newPage();
    await signInThroughForm(page, app.url, 'tuner@cellsmith.test', demoPassword());
    await openLogs(page);
    await logRows(page).first().waitFor();
    await screenshot(page, 'logs-list');

    const run = Date.now();
    const file = snakeCsv(`e2e-road-${run}.csv`, (run % 100_000) / 10);
    await uploadLog(page, VEHICLE, file);
    const upload = uploadArea(page);
    await upload.getByText(`${file.name} is ready.`).waitFor({ timeout: 30_000 });
    expect(await mappingDialog(page).count()).toBe(0);
    await upload.getByText('Columns recognised from the header.').waitFor();
    await logRows(page).filter({ hasText: file.name }).getByText('Ready').waitFor();
    await screenshot(page, 'logs-uploaded');

    await upload.getByRole('link', { name: 'Open the log' }).click();
    await page.getByRole('heading', { name: file.name, level: 1 }).waitFor();
    await page.getByRole('link', { name: VEHICLE }).waitFor();
    await page.getByRole('rowheader', { name: 'lambdaTarget' }).waitFor();
    expect(await page.locator('dt', { hasText: 'Rows kept' }).count()).toBe(1);
    await waitForLogChart(page);
    await screenshot(page, 'log-detail');
    await signOutThroughMenu(page);
    await page.close();
  });

  it.each(['light', 'dark'] as const)(
    'When the columns are unusual (%s scheme), then the mapping dialog asks, and the next file of that header goes straight through',
    async (scheme) => {
      const page = await (await openBrowser(scheme)).newPage();
      await signInThroughForm(page, app.url, 'tuner@cellsmith.test', demoPassword());
      await openLogs(page);
      const run = Date.now();
      const tag = `${scheme}${run}`;
      const first = oddHeaderCsv(`e2e-odd-${tag}.csv`, tag, run % 1_000_000);
      await fillUpload(page, VEHICLE, first, { ecuRevision: /^r\d+ · / });
      await uploadArea(page)
        .getByText('Corrections from this log are measured against this revision.')
        .waitFor();
      await screenshot(page, `logs-upload-${scheme}`);

      await uploadArea(page).getByRole('button', { name: 'Upload' }).click();
      const dialog = await waitForMappingDialog(page);
      await dialog.getByText('check · guessed', { exact: false }).waitFor();
      await dialog.getByText('Time: no column chosen').waitFor();
      await screenshot(page, `mapping-dialog-${scheme}`);

      await mapColumn(page, 'clock_s', 'Time');
      await mapColumn(page, 'probe_a', 'Measured lambda / AFR');
      await mapColumn(page, 'probe_a_aim', 'Commanded lambda / AFR');
      await mapColumn(page, 'pedal_pct', 'Throttle');
      await dialog.getByText('Commanded lambda / AFR: probe_a_aim').waitFor();
      await dialog.getByRole('button', { name: 'Confirm and upload' }).click();
      await dialog.waitFor({ state: 'detached' });
      const area = uploadArea(page);
      await area.getByText(`${first.name} is ready.`).waitFor({ timeout: 60_000 });
      await area.getByText('Columns read with your mapping, now saved for this header.').waitFor();

      // The same header again: the shop's preset is used, no dialog.
      const second = oddHeaderCsv(`e2e-odd-again-${tag}.csv`, tag, (run % 1_000_000) + 1);
      await uploadLog(page, VEHICLE, second);
      await area.getByText(`${second.name} is ready.`).waitFor({ timeout: 60_000 });
      await area.getByText('the shop’s saved mapping for this header', { exact: false }).waitFor();
      expect(await mappingDialog(page).count()).toBe(0);

      await logRows(page).filter({ hasText: first.name }).getByRole('link').click();
      await page.getByRole('heading', { name: first.name, level: 1 }).waitFor();
      await page.getByText('Source: given with the upload').waitFor();
      await waitForLogChart(page);
      await screenshot(page, `log-page-${scheme}`);
      // Zooming in with the wheel fetches the window again in full detail once the zoom rests.
      await zoomLogChart(page);
      await screenshot(page, `log-page-zoomed-${scheme}`);
      await signOutThroughMenu(page);
      await page.close();
    },
  );

  it('When the file has no commanded-lambda column, then the dialog names it and cancelling sends nothing', async () => {
    const page = await (await openBrowser('light')).newPage();
    await signInThroughForm(page, app.url, 'tuner@cellsmith.test', demoPassword());
    await openLogs(page);
    const run = Date.now();
    const file = snakeCsv(`e2e-no-target-${run}.csv`, (run % 100_000) / 10, {
      lambdaTarget: false,
    });
    await uploadLog(page, VEHICLE, file);
    const dialog = await waitForMappingDialog(page);
    await dialog.getByText('Commanded lambda / AFR: no column chosen').waitFor();
    expect(await dialog.getByRole('button', { name: 'Confirm and upload' }).isDisabled()).toBe(
      true,
    );
    await screenshot(page, 'logs-upload-missing-channel');
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await uploadArea(page).getByText('Not uploaded: the column mapping was cancelled.').waitFor();
    expect(await logRows(page).filter({ hasText: file.name }).count()).toBe(0);
    await signOutThroughMenu(page);
    await page.close();
  });

  it('When pages rendered, then the browser reported no CSP violation or script error', () => {
    expect(browsers.problems().filter((p) => !/401|Unauthorized|422/.test(p))).toEqual([]);
  });
});
