import { demoPassword } from '../../server/seed/demo-shop';
import { signInThroughForm } from './helpers/auth';
import { api } from './helpers/guard';
import { waitForDialogOpened } from './helpers/preferences';
import { grid } from './helpers/tables';
import { startRunningApp, type RunningApp } from './support/app-server';
import { browserPool, screenshot } from './support/browser';

const TUNER = 'tuner@cellsmith.test';

/** A table file as a spreadsheet might save it: title line, semicolons, decimal comma, RPM rows. */
const TABLE_FILE = [
  'Invented test table',
  'rpm\\map_kpa;30;60;100',
  '1000;40,5;55;70',
  '2000;45;62,25;80',
  '3000;50;70;88',
  '4000;48;68;85',
  '',
].join('\r\n');

describe('a new table from a file, in the browser', () => {
  let app: RunningApp;
  const browsers = browserPool();

  beforeAll(async () => {
    app = await startRunningApp();
  });
  afterAll(async () => {
    await browsers.closeAll();
    await app?.close();
  });

  it('When the tuner imports a table file on a vehicle without tables, then the workspace opens on it', async () => {
    const browser = await browsers.launch('light');
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, TUNER, demoPassword());
    const vehicle = await api<{ id: string }>(page, app.url, 'post', '/api/vehicles', {
      label: `Empty coupe ${Date.now()}`,
      engine: { displacementL: 2, cylinders: 4, fuel: 'gasoline', injectorCcMin: 450 },
      gearing: { tireDiameterMm: 630, gearRatios: [3.5, 2.1, 1.4, 1, 0.8], finalDrive: 3.9 },
    });
    await page.goto(`${app.url}/vehicles/${vehicle.id}`);
    await page.getByRole('button', { name: 'New table' }).click();
    const dialog = page.locator('mat-dialog-container');

    // Refusals with their row and column are covered by new-table-model.spec.ts.
    await waitForDialogOpened(page);
    await dialog.locator('input[type="file"]').setInputFiles({
      name: 'invented-table.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(TABLE_FILE),
    });
    await dialog
      .getByTestId('new-table-size')
      .filter({ hasText: '4 RPM × 3 MAP breakpoints' })
      .waitFor();
    await screenshot(page, 'new-table-import');
    await dialog.getByTestId('table-name').fill('Imported VE');
    await dialog.getByRole('button', { name: 'Create table' }).click();

    await page.getByRole('heading', { name: 'Imported VE', level: 1 }).waitFor();
    await grid(page).locator('.ag-cell').first().waitFor();
    const tables = (
      await (await page.request.get(`${app.url}/api/vehicles/${vehicle.id}/tables`)).json()
    ).items as { id: string; rpmAxis: number[]; mapAxisKpa: number[]; headRevisionId: string }[];
    expect(tables).toHaveLength(1);
    expect(tables[0]).toMatchObject({
      rpmAxis: [1000, 2000, 3000, 4000],
      mapAxisKpa: [30, 60, 100],
    });
    const revision = await (
      await page.request.get(`${app.url}/api/revisions/${tables[0]?.headRevisionId}`)
    ).json();
    // Rows follow MAP: the file's RPM rows come back transposed, decimal commas read.
    expect(revision.values).toEqual([
      [40.5, 45, 50, 48],
      [55, 62.25, 70, 68],
      [70, 80, 88, 85],
    ]);
    await screenshot(page, 'new-table-workspace');
    expect(browser.problems.filter((p) => !/401|Unauthorized/.test(p))).toEqual([]);
  });
});
