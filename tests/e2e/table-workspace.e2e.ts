import { demoPassword } from '../../db/seed/demo-shop';
import { signInThroughForm } from './helpers/auth';
import {
  applyAtFullStep,
  cell,
  editCell,
  grid,
  openTable,
  openTables,
  revisionNumber,
  runAnalysisWithAllLogs,
  scrollToHeading,
  showOverlay,
  waitForRevision,
} from './helpers/tables';
import { startRunningApp, type RunningApp } from './support/app-server';
import { launchBrowser, screenshot, type TestBrowser } from './support/browser';

const TUNER = 'tuner@cellsmith.test';
const VEHICLE = 'Demo hatch 1.6T';
const TABLE = 'Main VE';

/** Problems the pages reported, but the expected 401 of the session check before sign-in. */
function pageProblems(browser: TestBrowser): string[] {
  return browser.problems.filter((problem) => !/401|Unauthorized/.test(problem));
}

describe('the table workspace', () => {
  let app: RunningApp;
  let browser: TestBrowser;

  beforeAll(async () => {
    app = await startRunningApp();
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });

  it('When the tuner opens Main VE in dark mode, then the grid shows in our dark colours', async () => {
    browser = await launchBrowser('dark');
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, TUNER, demoPassword());
    await openTables(page);
    await openTable(page, VEHICLE, TABLE);
    await screenshot(page, 'table-workspace-dark');
    expect(pageProblems(browser)).toEqual([]);
    await browser.close();
  });

  it('When the tuner edits, analyses and applies at step 1, then a new revision is shown', async () => {
    browser = await launchBrowser('light');
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, TUNER, demoPassword());
    await openTables(page);
    await screenshot(page, 'tables-list');
    await openTable(page, VEHICLE, TABLE);
    const before = await revisionNumber(page);
    expect(await grid(page).locator('.ag-header-cell').count()).toBe(17);
    await screenshot(page, 'table-workspace');

    // An out-of-range value is refused with a message; a valid one is taken and undone.
    const original = await cell(page, 3, 4).innerText();
    await editCell(page, 3, 4, '999');
    await page.getByText('VE must be between 1 and 300 %; 999 is outside.').waitFor();
    expect(await cell(page, 3, 4).innerText()).toBe(original);
    await editCell(page, 3, 4, '77.7');
    await cell(page, 3, 4).filter({ hasText: '77.7' }).waitFor();
    await page.keyboard.press('Control+z');
    await cell(page, 3, 4).filter({ hasText: original }).waitFor();

    await runAnalysisWithAllLogs(page);
    await page
      .getByRole('table', { name: /Filter funnel of/ })
      .first()
      .scrollIntoViewIfNeeded();
    await screenshot(page, 'table-analysis');
    for (const overlay of ['Coverage', 'Proposal', 'Change vs base %', 'Lambda error %']) {
      await showOverlay(page, overlay);
    }
    expect(
      await grid(page).locator('.ag-cell').filter({ hasText: /[▲▼]/ }).count(),
    ).toBeGreaterThan(0);
    await scrollToHeading(page);
    await screenshot(page, 'table-lambda-error');

    await applyAtFullStep(page, 'e2e: full step');
    await page.getByText(`Applied as draft revision ${before + 1}.`).waitFor();
    await waitForRevision(page, before + 1);
    await scrollToHeading(page);
    await screenshot(page, 'table-applied');
    expect(pageProblems(browser)).toEqual([]);
  });
});
