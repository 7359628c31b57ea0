import type { Locator, Page } from 'playwright-core';
import { csvText, DEMO_HATCH, simulateSamples } from '../../../shared/sim';

/** A file for the upload's file input: name, type and bytes. */
export interface CsvFile {
  /** File name as the browser reports it. */
  name: string;
  /** MIME type. */
  mimeType: string;
  /** The contents. */
  buffer: Buffer;
}

/**
 * A small snake-style log: `rows` samples at 20 Hz starting at `startS` seconds (a different start
 * per run makes the content, and so its SHA-256, new each time). Without `lambdaTarget` the
 * commanded-lambda column is left out, which the server refuses with 422.
 */
export function snakeCsv(
  name: string,
  startS: number,
  options: { rows?: number; lambdaTarget?: boolean } = {},
): CsvFile {
  const rows = options.rows ?? 200;
  const withTarget = options.lambdaTarget ?? true;
  const header = ['time_s', 'engine_rpm', 'map_kpa', 'lambda_measured'];
  if (withTarget) header.push('lambda_target');
  const lines = [header.join(',')];
  for (let i = 0; i < rows; i++) {
    const phase = i / rows;
    const rpm = 1500 + 3500 * phase;
    const map = 40 + 120 * phase;
    const target = map > 100 ? 0.82 : 1;
    const measured = target * (1 + 0.02 * Math.sin(i / 7));
    const cells = [(startS + i * 0.05).toFixed(3), rpm.toFixed(0), map.toFixed(1)];
    cells.push(measured.toFixed(3));
    if (withTarget) cells.push(target.toFixed(2));
    lines.push(cells.join(','));
  }
  return { name, mimeType: 'text/csv', buffer: Buffer.from(`${lines.join('\n')}\n`) };
}

/** Opens the Logs page from the navigation and waits for its heading. */
export async function openLogs(page: Page): Promise<void> {
  await page.getByRole('navigation').getByRole('link', { name: 'Logs' }).click();
  await page.getByRole('heading', { name: 'Logs', level: 1 }).waitFor();
}

/** The data rows of the logs table (each links to its log). */
export function logRows(page: Page): Locator {
  return page
    .getByRole('table')
    .getByRole('row')
    .filter({ has: page.getByRole('link') });
}

/**
 * Invented column names no naming style knows, so the suggestion is unsure and the mapping
 * dialog opens; `manifold_x` is a weak MAP guess (marked "check"), `engine_rpm` stays sure.
 */
export const ODD_COLUMNS: Readonly<Record<string, string>> = {
  time_s: 'clock_s',
  map_kpa: 'manifold_x',
  lambda_measured: 'probe_a',
  lambda_target: 'probe_a_aim',
  throttle_pct: 'pedal_pct',
};

/**
 * A simulated 2-minute road drive of the demo hatch (the project's own simulator, snake style)
 * with the columns renamed as {@link ODD_COLUMNS}. `tag` renames the knock column too, so each
 * tag is a header of its own (no preset yet); `seed` makes the content, and so the file, new.
 */
export function oddHeaderCsv(name: string, tag: string, seed: number): CsvFile {
  const samples = simulateSamples({
    vehicle: DEMO_HATCH,
    kind: 'road',
    seed,
    durationS: 120,
    startEctC: 80,
  });
  const text = csvText(samples, 'snake', { stoichAfr: DEMO_HATCH.engine.stoichAfr });
  const newline = text.indexOf('\n');
  const renames: Record<string, string> = { ...ODD_COLUMNS, knock_deg: `spare_${tag}` };
  const header = text
    .slice(0, newline)
    .split(',')
    .map((column) => renames[column] ?? column)
    .join(',');
  return { name, mimeType: 'text/csv', buffer: Buffer.from(header + text.slice(newline)) };
}

/** The upload area. */
export function uploadArea(page: Page): Locator {
  return page.getByRole('region', { name: 'Upload log' });
}

/**
 * Picks a vehicle, kind and (optionally) the ECU revision in the upload area and chooses `file`,
 * without sending it.
 */
export async function fillUpload(
  page: Page,
  vehicleLabel: string,
  file: CsvFile,
  options: { kind?: 'Road drive' | 'Dyno session'; ecuRevision?: RegExp } = {},
): Promise<void> {
  const area = uploadArea(page);
  await area.getByRole('combobox', { name: 'Vehicle' }).click();
  await page.getByRole('option', { name: vehicleLabel, exact: true }).click();
  await area.getByRole('combobox', { name: 'Kind' }).click();
  await page.getByRole('option', { name: options.kind ?? 'Road drive', exact: true }).click();
  if (options.ecuRevision) {
    await area.getByRole('combobox', { name: 'ECU revision when recorded' }).click();
    await page.getByRole('option', { name: options.ecuRevision }).first().click();
  }
  await area.getByLabel('Choose a CSV file').setInputFiles(file);
  await area.getByText(file.name).waitFor();
}

/** Picks a vehicle and kind in the upload area, chooses `file` and presses Upload. */
export async function uploadLog(
  page: Page,
  vehicleLabel: string,
  file: CsvFile,
  kind: 'Road drive' | 'Dyno session' = 'Road drive',
): Promise<void> {
  await fillUpload(page, vehicleLabel, file, { kind });
  await uploadArea(page).getByRole('button', { name: 'Upload' }).click();
}

/** The column-mapping dialog. */
export function mappingDialog(page: Page): Locator {
  return page.getByRole('dialog').filter({ hasText: 'Map the columns of' });
}

/** The little of the page's window the fade check uses (these tests compile without DOM types). */
interface StyleView {
  document: { querySelector(selector: string): object | null };
  getComputedStyle(element: object): { opacity: string };
}

/** Waits until the mapping dialog is open and its opening animation has ended. */
export async function waitForMappingDialog(page: Page): Promise<Locator> {
  const dialog = mappingDialog(page);
  await dialog.waitFor();
  // A screenshot taken while the dialog and its backdrop fade in shows the page through them.
  await page.waitForFunction(() => {
    const view = globalThis as unknown as StyleView;
    return ['.mat-mdc-dialog-inner-container', '.cdk-overlay-backdrop'].every((selector) => {
      const element = view.document.querySelector(selector);
      return element !== null && view.getComputedStyle(element).opacity === '1';
    });
  });
  return dialog;
}

/**
 * Zooms the log chart in with the mouse wheel over its first panel, and waits for the zoomed
 * window to come back from the server in full detail.
 */
export async function zoomLogChart(page: Page): Promise<void> {
  const box = await page.locator('app-log-series-chart .chart').boundingBox();
  if (!box) throw new Error('zoomLogChart: the chart has no box');
  const detail = page.waitForResponse(
    (res) => res.url().includes('/series?') && res.url().includes('fromS='),
  );
  await page.mouse.move(box.x + box.width / 2, box.y + 90);
  for (let step = 0; step < 6; step++) await page.mouse.wheel(0, -240);
  const response = await detail;
  if (response.status() !== 200) {
    throw new Error(`zoomLogChart: the window answered ${response.status()}`);
  }
  await page
    .getByRole('progressbar', { name: 'Fetching the zoomed part' })
    .waitFor({ state: 'detached' });
}

/** In the mapping dialog, chooses `channel` (its label) for the column named `column`. */
export async function mapColumn(page: Page, column: string, channel: string): Promise<void> {
  await mappingDialog(page)
    .getByRole('combobox', { name: `Channel of column ${column}`, exact: true })
    .click();
  await page.getByRole('option', { name: channel, exact: true }).click();
}

/** Waits until the log page's chart is drawn and its funnel listed, and brings it into view. */
export async function waitForLogChart(page: Page): Promise<void> {
  await page.getByRole('heading', { name: 'Over time', level: 2 }).scrollIntoViewIfNeeded();
  await page.locator('app-log-series-chart canvas').first().waitFor();
  await page.getByRole('complementary', { name: 'Filter funnel' }).getByText('Kept:').waitFor();
  await page.locator('app-log-series-chart .chart').scrollIntoViewIfNeeded();
}
