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
    .getByRole('radio', { name: label, exact: true });
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

/** A cell of the grid as `[row, col]`, both from 0. */
export type GridCell = readonly [number, number];

/** Drags the mouse from one cell to another, selecting the range between them. */
export async function dragSelect(page: Page, from: GridCell, to: GridCell): Promise<void> {
  const start = await cell(page, ...from).boundingBox();
  const end = await cell(page, ...to).boundingBox();
  if (!start || !end) throw new Error('dragSelect: a cell is not on screen');
  await page.mouse.move(start.x + start.width / 2, start.y + start.height / 2);
  await page.mouse.down();
  await page.mouse.move(end.x + end.width / 2, end.y + end.height / 2, { steps: 8 });
  await page.mouse.up();
}

/** Waits until the grid says how many cells are selected ("3 × 4 cells selected"). */
export async function waitForSelectionSize(page: Page, text: string): Promise<void> {
  await page.getByTestId('selection-size').filter({ hasText: text }).waitFor();
}

/** The cell operations toolbar. */
export function cellOps(page: Page): Locator {
  return page.getByRole('toolbar', { name: 'Cell operations' });
}

/** Types the amount (if given) and presses an operation's button ("Scale %", "Offset", "Lock"…). */
export async function runCellOperation(page: Page, button: string, amount?: string): Promise<void> {
  if (amount !== undefined) await cellOps(page).getByLabel('Amount', { exact: true }).fill(amount);
  await cellOps(page).getByRole('button', { name: button, exact: true }).click();
}

/** The undo or redo button, whose name says what it would do. */
export function historyButton(page: Page, action: 'Undo' | 'Redo'): Locator {
  return page.getByRole('button', { name: new RegExp(`^${action}\\b`) });
}

/**
 * Puts `text` on the clipboard and pastes it with Ctrl+V into the focused grid cell, as a
 * spreadsheet copy would arrive. Needs the context's clipboard-read/write permissions.
 */
export async function pasteIntoGrid(page: Page, text: string): Promise<void> {
  // A string expression: the browser tests type-check without the DOM library.
  await page.evaluate(`navigator.clipboard.writeText(${JSON.stringify(text)})`);
  await page.keyboard.press('Control+V');
}

/** The clipboard's text (after a copy). */
export async function clipboardText(page: Page): Promise<string> {
  return String(await page.evaluate('navigator.clipboard.readText()'));
}

/** The text of every value cell, `[row][col]`. */
export async function gridTexts(page: Page, rows: number, cols: number): Promise<string[][]> {
  const texts: string[][] = [];
  for (let r = 0; r < rows; r++) {
    const row: string[] = [];
    for (let c = 0; c < cols; c++) row.push((await cell(page, r, c).innerText()).trim());
    texts.push(row);
  }
  return texts;
}

/** Types the revision message and saves the grid as a revision. */
export async function saveRevision(page: Page, message: string): Promise<void> {
  await page.getByLabel('Revision message').fill(message);
  await page.getByRole('button', { name: 'Save as revision' }).click();
}

/** The id of the table the page shows, from its address. */
export function tableIdOf(page: Page): string {
  const match = /\/tables\/([^/?#]+)/.exec(page.url());
  if (!match?.[1]) throw new Error(`no table id in ${page.url()}`);
  return match[1];
}

/** The values of the table's head revision, read through the API with the page's session. */
export async function headRevisionValues(
  page: Page,
  tableId: string,
): Promise<{ id: string; number: number; values: number[][] }> {
  const origin = new URL(page.url()).origin;
  const table = await page.request.get(`${origin}/api/tables/${tableId}`);
  const { headRevisionId } = (await table.json()) as { headRevisionId: string };
  const revision = await page.request.get(`${origin}/api/revisions/${headRevisionId}`);
  if (!revision.ok()) throw new Error(`GET /api/revisions/${headRevisionId}: ${revision.status()}`);
  return (await revision.json()) as { id: string; number: number; values: number[][] };
}
