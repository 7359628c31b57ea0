import { demoPassword } from '../../server/seed/demo-shop';
import { signInThroughForm } from './helpers/auth';
import {
  fillUpload,
  mapColumn,
  oddHeaderCsv,
  openLogs,
  uploadArea,
  waitForMappingDialog,
  waitForLogChart,
  logRows,
} from './helpers/logs';
import {
  cell,
  dragSelect,
  gridTexts,
  headRevisionValues,
  openTable,
  openTables,
  scrollToHeading,
  showOverlay,
  tableIdOf,
  waitForRevision,
  waitForSelectionSize,
} from './helpers/tables';
import {
  analyseOneLog,
  analysisPanel,
  applyAsDraft,
  prepareApplyToSelection,
  showPlotTab,
} from './helpers/tuner-loop';
import { openVehicle, openVehicles } from './helpers/vehicles';
import { startRunningApp, type RunningApp } from './support/app-server';
import { browserPool, screenshot, type TestBrowser } from './support/browser';

const TUNER = 'tuner@cellsmith.test';
const VEHICLE = 'Demo hatch 1.6T';
const TABLE = 'Main VE';

/** The grid's text of a VE value (one decimal, as the workspace shows it). */
const veText = (value: number): string => value.toFixed(1);

/** Problems the pages reported, but the expected 401 of the session check before sign-in. */
function pageProblems(browser: TestBrowser): string[] {
  return browser.problems.filter((problem) => !/401|Unauthorized/.test(problem));
}

describe('the tuner’s loop in the browser', () => {
  let app: RunningApp;
  const browsers = browserPool();
  const launch = browsers.launch;
  /** The log uploaded by the loop, opened again by the tour. */
  let logPath = '';

  beforeAll(async () => {
    app = await startRunningApp();
  });
  afterAll(async () => {
    await browsers.closeAll();
    await app?.close();
  });

  it('When a tuner uploads, maps, analyses and applies part of the proposal to a selection, then the saved revision holds what the grid showed', async () => {
    const browser = await launch('light');
    const page = await browser.newPage();
    await signInThroughForm(page, app.url, TUNER, demoPassword());

    // Upload a simulated drive whose column names the product cannot be sure of: it asks.
    await openLogs(page);
    const run = Date.now();
    const tag = `loop${run}`;
    const file = oddHeaderCsv(`e2e-loop-${tag}.csv`, tag, run % 1_000_000);
    await fillUpload(page, VEHICLE, file);
    await uploadArea(page).getByRole('button', { name: 'Upload' }).click();
    await waitForMappingDialog(page);
    await mapColumn(page, 'clock_s', 'Time');
    await mapColumn(page, 'probe_a', 'Measured lambda / AFR');
    await mapColumn(page, 'probe_a_aim', 'Commanded lambda / AFR');
    await mapColumn(page, 'pedal_pct', 'Throttle');
    await page.getByRole('button', { name: 'Confirm and upload' }).click();
    await uploadArea(page).getByText(`${file.name} is ready.`).waitFor({ timeout: 60_000 });
    await logRows(page).filter({ hasText: file.name }).getByRole('link').click();
    await page.getByRole('heading', { name: file.name, level: 1 }).waitFor();
    logPath = new URL(page.url()).pathname;

    // The table: analyse only this log.
    await openTables(page);
    await openTable(page, VEHICLE, TABLE);
    const tableId = tableIdOf(page);
    const base = await headRevisionValues(page, tableId);
    await analyseOneLog(page, file.name);

    // Select a block and preview applying the proposal to it alone, at full step.
    const block = { r0: 4, r1: 8, c0: 3, c1: 8 };
    await scrollToHeading(page);
    await cell(page, block.r1, block.c1).scrollIntoViewIfNeeded();
    await dragSelect(page, [block.r0, block.c0], [block.r1, block.c1]);
    await waitForSelectionSize(page, '5 × 6 cells selected');
    await prepareApplyToSelection(page, 'e2e: the loop, part of the proposal');
    await showOverlay(page, 'Proposal');
    await analysisPanel(page)
      .getByText(/cells? changes?|No cell changes/)
      .first()
      .waitFor();
    await scrollToHeading(page);
    await screenshot(page, 'tuner-loop-preview');
    const rows = base.values.length;
    const cols = base.values[0]?.length ?? 0;
    const shown = await gridTexts(page, rows, cols);

    await applyAsDraft(page);
    await page.getByText(/Applied as draft revision \d+\./).waitFor({ timeout: 30_000 });
    await waitForRevision(page, base.number + 1);
    const saved = await headRevisionValues(page, tableId);

    // What the grid showed before applying is what was stored…
    expect(saved.number).toBe(base.number + 1);
    expect(saved.values.map((row) => row.map(veText))).toEqual(shown);
    // …only the selected cells moved, and some of them did…
    let changedInside = 0;
    for (let r = 0; r < rows; r++) {
      for (let c = 0; c < cols; c++) {
        const inside = r >= block.r0 && r <= block.r1 && c >= block.c0 && c <= block.c1;
        if (!inside) expect([r, c, saved.values[r][c]]).toEqual([r, c, base.values[r][c]]);
        else if (saved.values[r][c] !== base.values[r][c]) changedInside++;
      }
    }
    expect(changedInside).toBeGreaterThan(0);
    // …and the workspace now shows the saved draft.
    await showOverlay(page, 'VE');
    expect(await gridTexts(page, rows, cols)).toEqual(saved.values.map((row) => row.map(veText)));
    expect(await cell(page, block.r0, block.c0).innerText()).toContain(
      veText(saved.values[block.r0][block.c0]),
    );
    expect(pageProblems(browser)).toEqual([]);
  });

  it.each(['light', 'dark'] as const)(
    'When the tuner tours the pages (%s scheme), then each draws without a problem',
    async (scheme) => {
      const browser = await launch(scheme);
      const page = await browser.newPage();
      await signInThroughForm(page, app.url, TUNER, demoPassword());

      await openVehicles(page);
      await screenshot(page, `tour-vehicles-${scheme}`);
      await openVehicle(page, VEHICLE);
      await screenshot(page, `tour-vehicle-${scheme}`);

      if (logPath) {
        await page.goto(`${app.url}${logPath}`);
        await waitForLogChart(page);
        await screenshot(page, `tour-log-${scheme}`);
      }

      await openTables(page);
      await openTable(page, VEHICLE, TABLE);
      await analysisPanel(page).waitFor();
      // The newest earlier analysis opens again, so the overlays and plots have evidence.
      const history = page.getByRole('combobox', { name: /Earlier analyses/ });
      if ((await history.count()) > 0) {
        await history.click();
        await page.getByRole('option').first().click();
      }
      await showOverlay(page, 'Lambda error %');
      await scrollToHeading(page);
      await screenshot(page, `tour-workspace-${scheme}`);
      await showPlotTab(page, 'Heat map');
      await screenshot(page, `tour-plots-heat-${scheme}`);
      await showPlotTab(page, 'Samples');
      await screenshot(page, `tour-plots-samples-${scheme}`);
      await cell(page, 6, 6).click();
      await showPlotTab(page, 'Cell');
      await screenshot(page, `tour-plots-cell-${scheme}`);
      expect(pageProblems(browser)).toEqual([]);
    },
  );
});
