import type { Locator, Page } from 'playwright-core';

/** Opens the Tables area from the navigation and waits for its list. */
export async function openTables(page: Page): Promise<void> {
  await page.getByRole('navigation').getByRole('link', { name: 'Tables' }).click();
  await page.getByRole('heading', { name: 'Tables', level: 1 }).waitFor();
}

/** Opens the table `tableName` of the vehicle `vehicleLabel` and waits for its grid. */
export async function openTable(
  page: Page,
  vehicleLabel: string,
  tableName: string,
): Promise<void> {
  const section = page.getByRole('region', { name: vehicleLabel, exact: true });
  await section.getByRole('link', { name: new RegExp(tableName) }).click();
  await page.getByRole('heading', { name: tableName, level: 1 }).waitFor();
  await grid(page).locator('.ag-cell').first().waitFor();
}

/** The VE grid. */
export function grid(page: Page): Locator {
  return page.locator('app-table-grid');
}

/** The revision number shown above the grid. */
export async function revisionNumber(page: Page): Promise<number> {
  const text = await page.getByTestId('revision-line').innerText();
  const match = /Revision (\d+)/.exec(text);
  if (!match) throw new Error(`no revision number in "${text}"`);
  return Number(match[1]);
}

/** Waits until the revision line shows `number`. */
export async function waitForRevision(page: Page, number: number): Promise<void> {
  await page
    .getByTestId('revision-line')
    .filter({ hasText: new RegExp(`Revision ${number} of`) })
    .waitFor();
}

/** Switches the cell overlay by its label. */
export async function showOverlay(page: Page, label: string): Promise<void> {
  const toggle = page
    .getByRole('radiogroup', { name: 'Cell overlay' })
    .getByRole('radio', { name: label });
  await toggle.click();
  // The grid names its overlay in its accessible label once the switch has rendered.
  await page.locator(`app-table-grid ag-grid-angular[aria-label*="${label}"]`).first().waitFor();
}

/** The text of the cell at `row` (from 0) and RPM column `col` (from 0). */
export function cell(page: Page, row: number, col: number): Locator {
  return grid(page).locator(`.ag-row[row-index="${row}"] .ag-cell[col-id="c${col}"]`);
}

/** Types `value` into a cell and presses Enter. */
export async function editCell(page: Page, row: number, col: number, value: string): Promise<void> {
  await cell(page, row, col).dblclick();
  const editor = grid(page).locator('.ag-cell-editor input, input.ag-input-field-input').first();
  await editor.fill(value);
  await editor.press('Enter');
}

/** Runs an analysis with every log listed, and waits for its funnel. */
export async function runAnalysisWithAllLogs(page: Page): Promise<void> {
  const panel = page.getByRole('region', { name: 'Analysis' });
  const boxes = panel.getByRole('checkbox');
  const count = await boxes.count();
  for (let i = 0; i < count; i++) await boxes.nth(i).check();
  await panel.getByRole('button', { name: 'Run analysis' }).click();
  await panel
    .getByRole('table', { name: /Filter funnel of/ })
    .first()
    .waitFor({ timeout: 60_000 });
}

/** Sets the step fraction to its end (1) with the keyboard and applies the analysis. */
export async function applyAtFullStep(page: Page, message: string): Promise<void> {
  const panel = page.getByRole('region', { name: 'Analysis' });
  const slider = panel.getByRole('slider', { name: 'Step fraction' });
  await slider.focus();
  await slider.press('End');
  await panel.getByText('Step fraction: 1.00').waitFor();
  await panel.getByLabel('Message of the draft').fill(message);
  await panel.getByRole('button', { name: 'Apply as draft' }).click();
}

/** Scrolls the workspace back to its heading (the shell scrolls its content, not the page). */
export async function scrollToHeading(page: Page): Promise<void> {
  await page.getByRole('heading', { level: 1 }).scrollIntoViewIfNeeded();
}
