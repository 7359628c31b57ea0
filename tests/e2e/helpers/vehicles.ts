import type { Locator, Page } from 'playwright-core';

/** The engine and gearing typed into the vehicle dialog. */
export interface VehicleFields {
  /** Unique label. */
  label: string;
  /** Displacement in litres. */
  displacementL: string;
  /** Cylinder count. */
  cylinders: string;
  /** Injector flow in cc/min. */
  injectorCcMin: string;
  /** Fuel name as the menu shows it. */
  fuel: string;
  /** Tyre size for the diameter helper: width mm, aspect %, rim in. */
  tyre: [string, string, string];
  /** Gear ratios, comma-separated. */
  gearRatios: string;
  /** Final drive ratio. */
  finalDrive: string;
}

/** Opens the Vehicles page from the navigation and waits for its heading. */
export async function openVehicles(page: Page): Promise<void> {
  await page.getByRole('navigation').getByRole('link', { name: 'Vehicles' }).click();
  await page.getByRole('heading', { name: 'Vehicles', level: 1 }).waitFor();
}

/** The "New vehicle" button of the list. */
export function newVehicleButton(page: Page): Locator {
  return page.getByRole('button', { name: 'New vehicle' });
}

/** The data rows of the vehicles table (each links to its vehicle). */
export function vehicleRows(page: Page): Locator {
  return page
    .getByRole('table')
    .getByRole('row')
    .filter({ has: page.getByRole('link') });
}

/** Types into the search box and waits until every row left mentions `text`. */
export async function searchVehicles(page: Page, text: string): Promise<void> {
  await page.getByLabel('Search vehicles').fill(text);
  const pattern = new RegExp(text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'), 'i');
  await vehicleRows(page).filter({ hasNotText: pattern }).first().waitFor({ state: 'detached' });
  await vehicleRows(page).first().waitFor();
}

/** Opens a vehicle's page from its link in the list and waits for its heading. */
export async function openVehicle(page: Page, label: string): Promise<void> {
  await page.getByRole('link', { name: label, exact: true }).click();
  await page.getByRole('heading', { name: label, level: 1 }).waitFor();
}

/** Opens the new-vehicle dialog and fills it in, without sending it. */
export async function fillNewVehicleDialog(page: Page, fields: VehicleFields): Promise<void> {
  await newVehicleButton(page).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('Label').fill(fields.label);
  await dialog.getByLabel('Displacement').fill(fields.displacementL);
  await dialog.getByLabel('Cylinders').fill(fields.cylinders);
  await dialog.getByLabel('Injector flow').fill(fields.injectorCcMin);
  await dialog.getByRole('combobox', { name: 'Fuel' }).click();
  await page.getByRole('option', { name: fields.fuel, exact: true }).click();
  const [width, aspect, rim] = fields.tyre;
  await dialog.getByLabel('Width').fill(width);
  await dialog.getByLabel('Aspect').fill(aspect);
  await dialog.getByLabel('Rim').fill(rim);
  await dialog.getByRole('button', { name: /^Use .* mm$/ }).click();
  await dialog.getByLabel('Gear ratios').fill(fields.gearRatios);
  await dialog.getByLabel('Final drive').fill(fields.finalDrive);
}

/** Sends the filled-in dialog and waits for the new vehicle's page. */
export async function submitNewVehicleDialog(page: Page, fields: VehicleFields): Promise<void> {
  const dialog = page.getByRole('dialog');
  await dialog.getByRole('button', { name: 'Create vehicle' }).click();
  await dialog.waitFor({ state: 'detached' });
  await page.getByRole('heading', { name: fields.label, level: 1 }).waitFor();
}

/** The value a labelled fact shows on a vehicle's page (the `dd` after its `dt`). */
export function vehicleFact(page: Page, name: string): Locator {
  return page.locator('dt', { hasText: name }).locator('xpath=following-sibling::dd[1]');
}
