import type { Locator, Page } from 'playwright-core';

/** The analysis panel of the workspace. */
export function analysisPanel(page: Page): Locator {
  return page.getByRole('region', { name: 'Analysis' });
}

/** Ticks only the log named `fileName` in the analysis panel, runs it and waits for its funnel. */
export async function analyseOneLog(page: Page, fileName: string): Promise<void> {
  const panel = analysisPanel(page);
  const boxes = panel.getByRole('checkbox');
  const count = await boxes.count();
  for (let i = 0; i < count; i++) await boxes.nth(i).uncheck();
  await panel.getByRole('checkbox', { name: fileName }).check();
  await panel.getByRole('button', { name: 'Run analysis' }).click();
  await panel
    .getByRole('table', { name: `Filter funnel of ${fileName}` })
    .waitFor({ timeout: 60_000 });
}

/**
 * Chooses "Only the selected cells", the step fraction at its end (1) and a message, and waits
 * until the live preview has been computed for those options (its summary shows).
 */
export async function prepareApplyToSelection(page: Page, message: string): Promise<void> {
  const panel = analysisPanel(page);
  await panel.getByRole('radio', { name: /Only the selected cells/ }).check();
  const slider = panel.getByRole('slider', { name: 'Step fraction' });
  await slider.focus();
  await slider.press('End');
  await panel.getByText('Step fraction: 1.00').waitFor();
  await panel.getByLabel('Message of the draft').fill(message);
}

/** Presses "Apply as draft". */
export async function applyAsDraft(page: Page): Promise<void> {
  await analysisPanel(page).getByRole('button', { name: 'Apply as draft' }).click();
}

/** Scrolls to the plots, waits for ECharts to draw and opens the tab named `tab`. */
export async function showPlotTab(page: Page, tab: 'Heat map' | 'Samples' | 'Cell'): Promise<void> {
  const plots = page.locator('app-workspace-plots');
  await page.locator('.plots-slot').scrollIntoViewIfNeeded();
  await plots.waitFor();
  await plots.getByRole('tab', { name: tab }).click();
  if (tab !== 'Cell') await plots.locator('canvas').first().waitFor();
}
