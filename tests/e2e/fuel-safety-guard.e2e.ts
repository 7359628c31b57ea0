import type { Page } from 'playwright-core';
import { demoPassword } from '../../server/seed/demo-shop';
import { signInThroughForm } from './helpers/auth';
import { richTableWithRoadLog } from './helpers/guard';
import { grid, runAnalysisWithAllLogs, showOverlay } from './helpers/tables';
import { startRunningApp, type RunningApp } from './support/app-server';
import { browserPool, screenshot } from './support/browser';

const TUNER = 'tuner@cellsmith.test';

/** The head revision of a table with how it was applied, read with the page's session. */
async function headRevision(
  page: Page,
  baseUrl: string,
  tableId: string,
): Promise<{ number: number; applied: { heldCells: unknown[]; guard: unknown } | null }> {
  const table = (await (await page.request.get(`${baseUrl}/api/tables/${tableId}`)).json()) as {
    headRevisionId: string;
  };
  const res = await page.request.get(`${baseUrl}/api/revisions/${table.headRevisionId}`);
  return (await res.json()) as Awaited<ReturnType<typeof headRevision>>;
}

describe('the fuel-safety guard in the workspace', () => {
  let app: RunningApp;
  const browsers = browserPool();

  beforeAll(async () => {
    app = await startRunningApp();
  });
  afterAll(async () => {
    await browsers.closeAll();
    await app?.close();
  });

  it('When a road log leaves the boost cells unmeasured, then the held cells are marked, counted and stored', async () => {
    const browser = await browsers.launch('light');
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, TUNER, demoPassword());
    const { tableId, tableName } = await richTableWithRoadLog(page, app.url, `${Date.now()}`);

    await page.goto(`${app.url}/tables/${tableId}`);
    await page.getByRole('heading', { name: tableName, level: 1 }).waitFor();
    await grid(page).locator('.ag-cell').first().waitFor();
    await runAnalysisWithAllLogs(page);

    // The preview counts the held cells and the guard is on by default.
    const panel = page.getByRole('region', { name: 'Analysis' });
    expect(
      await panel.getByRole('checkbox', { name: /Fuel-safety guard under load/ }).isChecked(),
    ).toBe(true);
    const held = panel.getByTestId('preview-held');
    await held.filter({ hasText: /held under load: need data/ }).waitFor({ timeout: 30_000 });
    const count = Number(/(\d+) cells? held/.exec(await held.innerText())?.[1] ?? 'NaN');
    expect(count).toBeGreaterThan(10);

    // The grid marks them, not by colour alone: a class with a glyph and a title that says why.
    await showOverlay(page, 'Change vs base %');
    const marked = grid(page).locator('.ag-cell.cs-held');
    await marked.first().waitFor();
    expect(await marked.count()).toBeGreaterThan(0);
    expect((await marked.first().getAttribute('title')) ?? '').toMatch(/held/i);
    await marked.first().scrollIntoViewIfNeeded();
    await screenshot(page, 'guard-held-cells');

    // Applying with the defaults stores the same cells as needing data.
    const before = await headRevision(page, app.url, tableId);
    await panel.getByRole('button', { name: 'Apply as draft' }).click();
    const deadline = Date.now() + 30_000;
    let after = before;
    while (after.number === before.number && Date.now() < deadline) {
      await page.waitForTimeout(250);
      after = await headRevision(page, app.url, tableId);
    }
    expect(after.number).toBe(before.number + 1);
    expect(after.applied?.guard).not.toBeNull();
    expect(after.applied?.heldCells).toHaveLength(count);
    expect(browser.problems.filter((p) => !/401|Unauthorized/.test(p))).toEqual([]);
  });
});
