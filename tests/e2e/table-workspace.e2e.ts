import { demoPassword } from '../../server/seed/demo-shop';
import { signInThroughForm } from './helpers/auth';
import {
  applyAtFullStep,
  cell,
  clipboardText,
  dragSelect,
  editCell,
  grid,
  gridTexts,
  headRevisionValues,
  historyButton,
  openTable,
  openTables,
  pasteIntoGrid,
  revisionNumber,
  runAnalysisWithAllLogs,
  runCellOperation,
  saveRevision,
  scrollToHeading,
  showOverlay,
  tableIdOf,
  waitForRevision,
  waitForSelectionSize,
} from './helpers/tables';
import { startRunningApp, type RunningApp } from './support/app-server';
import { browserPool, screenshot, type TestBrowser } from './support/browser';

const TUNER = 'tuner@cellsmith.test';
const VEHICLE = 'Demo hatch 1.6T';
const TABLE = 'Main VE';

/** Rounded to 0.01, as the workspace and revisions store VE. */
const round2 = (value: number): number => Math.round(value * 100) / 100;

/** The grid's text of a VE value. */
const veText = (value: number): string => value.toFixed(1);

/** Problems the pages reported, but the expected 401 of the session check before sign-in. */
function pageProblems(browser: TestBrowser): string[] {
  return browser.problems.filter((problem) => !/401|Unauthorized/.test(problem));
}

describe('the table workspace', () => {
  let app: RunningApp;
  let browser: TestBrowser;
  /** Every browser launched here: each test starts its own, all are closed at the end. */
  const browsers = browserPool();
  const launch = browsers.launch;

  beforeAll(async () => {
    app = await startRunningApp();
  });
  afterAll(async () => {
    await browsers.closeAll();
    await app?.close();
  });

  it('When the tuner opens Main VE in dark mode, then the grid shows in our dark colours', async () => {
    browser = await launch('dark');
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, TUNER, demoPassword());
    await openTables(page);
    await openTable(page, VEHICLE, TABLE);
    await screenshot(page, 'table-workspace-dark');
    await dragSelect(page, [3, 2], [6, 5]);
    await waitForSelectionSize(page, '4 × 4 cells selected');
    await screenshot(page, 'table-workspace-dark-selection');
    // Keys: shift+arrow extends the moving end, Escape shrinks to the focused cell, Ctrl+A all.
    await page.keyboard.press('Shift+ArrowDown');
    await waitForSelectionSize(page, '5 × 4 cells selected');
    await page.keyboard.press('Escape');
    await waitForSelectionSize(page, '1 cell selected');
    await page.keyboard.press('Control+A');
    await waitForSelectionSize(page, '16 × 16 cells selected');
    expect(pageProblems(browser)).toEqual([]);
    await browser.close();
  });

  it('When the tuner edits, analyses and applies at step 1, then a new revision is shown', async () => {
    browser = await launch('light');
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

  it('When the tuner scales, undoes, redoes, pastes, locks and saves, then the revision holds what the grid showed', async () => {
    browser = await launch('light');
    await browser.context.grantPermissions(['clipboard-read', 'clipboard-write'], {
      origin: app.url,
    });
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, TUNER, demoPassword());
    await openTables(page);
    await openTable(page, VEHICLE, TABLE);
    const tableId = tableIdOf(page);
    const start = await headRevisionValues(page, tableId);
    const expected = start.values.map((row) => [...row]);
    const rows = expected.length;
    const cols = expected[0]?.length ?? 0;
    const block = { r0: 2, r1: 4, c0: 3, c1: 6 };

    // Drag a 3 × 4 selection; Ctrl+C puts it on the clipboard as tab-separated numbers.
    await dragSelect(page, [block.r0, block.c0], [block.r1, block.c1]);
    await waitForSelectionSize(page, '3 × 4 cells selected');
    await cell(page, block.r0, block.c0).focus();
    await page.keyboard.press('Control+C');
    const copied = expected
      .slice(block.r0, block.r1 + 1)
      .map((row) =>
        row
          .slice(block.c0, block.c1 + 1)
          .map(String)
          .join('\t'),
      )
      .join('\r\n');
    expect(await clipboardText(page)).toBe(copied);

    // Scale +5 %: twelve cells, one undo step; undo and redo go back and forth.
    await runCellOperation(page, 'Scale %', '5');
    for (let r = block.r0; r <= block.r1; r++)
      for (let c = block.c0; c <= block.c1; c++) expected[r][c] = round2(start.values[r][c] * 1.05);
    const corner = () => cell(page, block.r1, block.c1);
    await corner()
      .filter({ hasText: veText(expected[block.r1][block.c1]) })
      .waitFor();
    await historyButton(page, 'Undo').and(page.getByLabel('Undo Scale +5 % (12 cells)')).waitFor();
    await screenshot(page, 'table-workspace-scaled');
    await historyButton(page, 'Undo').click();
    await corner()
      .filter({ hasText: veText(start.values[block.r1][block.c1]) })
      .waitFor();
    await historyButton(page, 'Redo').click();
    await corner()
      .filter({ hasText: veText(expected[block.r1][block.c1]) })
      .waitFor();

    // Paste a 2 × 2 block from a spreadsheet at (6, 2): CRLF rows, a trailing line break.
    await cell(page, 6, 2).click();
    await waitForSelectionSize(page, '1 cell selected');
    await pasteIntoGrid(page, '61.5\t62.5\r\n63.5\t64.5\r\n');
    Object.assign(expected[6], { 2: 61.5, 3: 62.5 });
    Object.assign(expected[7], { 2: 63.5, 3: 64.5 });
    await cell(page, 7, 3).filter({ hasText: '64.5' }).waitFor();

    // Lock (6, 2), then offset the pasted block by +1: the locked cell keeps its value.
    await runCellOperation(page, 'Lock');
    await cell(page, 6, 2).and(page.locator('.cs-locked')).waitFor();
    await dragSelect(page, [6, 2], [7, 3]);
    await waitForSelectionSize(page, '2 × 2 cells selected');
    await runCellOperation(page, 'Offset', '1');
    for (const [r, c] of [
      [6, 3],
      [7, 2],
      [7, 3],
    ] as const)
      expected[r][c] = round2(expected[r][c] + 1);
    await cell(page, 7, 3).filter({ hasText: '65.5' }).waitFor();
    expect(await cell(page, 6, 2).innerText()).toContain('61.5');
    await scrollToHeading(page);
    await screenshot(page, 'table-workspace-selection');

    await saveRevision(page, 'e2e: scale, paste, lock');
    await page.getByText(`Saved as revision ${start.number + 1}.`).waitFor();
    await waitForRevision(page, start.number + 1);
    const shown = await gridTexts(page, rows, cols);
    const saved = await headRevisionValues(page, tableId);
    expect(saved.number).toBe(start.number + 1);
    expect(saved.values).toEqual(expected);
    expect(shown).toEqual(saved.values.map((row) => row.map(veText)));
    expect(pageProblems(browser)).toEqual([]);
  });
});
