import type { Locator, Page } from 'playwright-core';

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

/** Picks a vehicle and kind in the upload area, chooses `file` and presses Upload. */
export async function uploadLog(
  page: Page,
  vehicleLabel: string,
  file: CsvFile,
  kind: 'Road drive' | 'Dyno session' = 'Road drive',
): Promise<void> {
  const area = page.getByRole('region', { name: 'Upload log' });
  await area.getByRole('combobox', { name: 'Vehicle' }).click();
  await page.getByRole('option', { name: vehicleLabel, exact: true }).click();
  await area.getByRole('combobox', { name: 'Kind' }).click();
  await page.getByRole('option', { name: kind, exact: true }).click();
  await area.getByLabel('Choose a CSV file').setInputFiles(file);
  await area.getByText(file.name).waitFor();
  await area.getByRole('button', { name: 'Upload' }).click();
}
