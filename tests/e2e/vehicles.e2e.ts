import { demoPassword } from '../../server/seed/demo-shop';
import { signInThroughForm, signOutThroughMenu } from './helpers/auth';
import {
  fillNewVehicleDialog,
  newVehicleButton,
  openVehicle,
  openVehicles,
  searchVehicles,
  submitNewVehicleDialog,
  vehicleFact,
  type VehicleFields,
  vehicleRows,
} from './helpers/vehicles';
import { startRunningApp, type RunningApp } from './support/app-server';
import { launchBrowser, screenshot, type TestBrowser } from './support/browser';

describe('the vehicles area', () => {
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

  it('When the demo tuner searches and opens a vehicle, then its facts, tables and logs show', async () => {
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, 'tuner@cellsmith.test', demoPassword());
    await openVehicles(page);
    await newVehicleButton(page).waitFor();
    await screenshot(page, 'vehicles-list');

    await searchVehicles(page, 'hatch');
    expect(await vehicleRows(page).count()).toBeGreaterThanOrEqual(1);
    await openVehicle(page, 'Demo hatch 1.6T');
    await page.getByRole('heading', { name: 'VE tables' }).waitFor();
    await page.getByRole('link', { name: 'Open table' }).first().waitFor();
    await page
      .getByText(/^r\d+$/)
      .first()
      .waitFor();
    await page.getByRole('table').getByText(/\.csv/).first().waitFor();
    await page.getByText('Session plans are not built yet', { exact: false }).waitFor();
    await screenshot(page, 'vehicle-demo-hatch');
    await page.getByRole('heading', { name: 'Session plans' }).scrollIntoViewIfNeeded();
    await screenshot(page, 'vehicle-demo-hatch-logs');
    await signOutThroughMenu(page);
    await page.close();
  });

  it('When the demo tuner creates a vehicle, then its page shows what was entered', async () => {
    const page = await browser.newPage();
    const label = `E2E coupe ${Date.now()}`;
    await signInThroughForm(page, app.url, 'tuner@cellsmith.test', demoPassword());
    await openVehicles(page);
    const fields: VehicleFields = {
      label,
      displacementL: '2.2',
      cylinders: '4',
      injectorCcMin: '650',
      fuel: 'E85',
      tyre: ['225', '45', '17'],
      gearRatios: '3.31, 2.05, 1.48, 1.16, 0.94, 0.79',
      finalDrive: '4.1',
    };
    await fillNewVehicleDialog(page, fields);
    await screenshot(page, 'vehicle-dialog');
    await submitNewVehicleDialog(page, fields);
    expect(page.url()).toMatch(/\/vehicles\/[0-9a-f-]{36}$/);
    expect(await vehicleFact(page, 'Tyre diameter').textContent()).toContain('634.3 mm');
    expect(await vehicleFact(page, 'Fuel').first().textContent()).toContain('E85');
    await page.getByText('No VE tables on this vehicle yet.').waitFor();
    await screenshot(page, 'vehicle-created');
    await signOutThroughMenu(page);
    await page.close();
  });

  it('When the operator opens the list, then there is no "New vehicle" button', async () => {
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, 'operator@cellsmith.test', demoPassword());
    await openVehicles(page);
    await vehicleRows(page).first().waitFor();
    expect(await newVehicleButton(page).count()).toBe(0);
    await screenshot(page, 'vehicles-operator');
    await signOutThroughMenu(page);
    await page.close();
  });

  it('When pages rendered, then the browser reported no CSP violation or script error', () => {
    expect(browser.problems.filter((p) => !/401|Unauthorized/.test(p))).toEqual([]);
  });
});
