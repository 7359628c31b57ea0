import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { noAnimations } from '../../../../testing/harness-helpers';
import { type HoldsUnsavedEdits, unsavedEditsGuard } from './unsaved-edits-guard';

/** A page holding as many unsaved cells as `edited` says. */
@Component({
  selector: 'app-edits-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: 'edits',
})
class EditsPage implements HoldsUnsavedEdits {
  readonly edited = signal(0);
  unsavedCellCount(): number {
    return this.edited();
  }
}

/** Somewhere else to go. */
@Component({
  selector: 'app-elsewhere',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: 'elsewhere',
})
class Elsewhere {}

describe('unsavedEditsGuard', () => {
  let harness: RouterTestingHarness;
  let page: EditsPage;
  let dialogs: HarnessLoader;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        noAnimations,
        provideRouter([
          { path: 'table', component: EditsPage, canDeactivate: [unsavedEditsGuard] },
          { path: 'elsewhere', component: Elsewhere },
        ]),
      ],
    });
    harness = await RouterTestingHarness.create();
    page = await harness.navigateByUrl('/table', EditsPage);
    dialogs = TestbedHarnessEnvironment.documentRootLoader(harness.fixture);
  });

  /**
   * The open dialog's text, and a click on its button reading `label`. Read from the DOM: the
   * navigation waits for the answer, so the page is not stable and harnesses would wait too.
   */
  async function openDialog(): Promise<{ text: string; click: (label: string) => void }> {
    await new Promise((resolve) => setTimeout(resolve));
    harness.fixture.detectChanges();
    const container = document.querySelector<HTMLElement>('mat-dialog-container');
    if (!container) throw new Error('no dialog is open');
    const click = (label: string): void => {
      const buttons = Array.from(container.querySelectorAll('button'));
      const button = buttons.find((b) => b.textContent?.trim() === label);
      if (!button) throw new Error(`no button "${label}"`);
      button.click();
    };
    return { text: container.textContent ?? '', click };
  }

  /** Starts leaving for `/elsewhere` and returns the navigation's outcome, once settled. */
  function leave(): Promise<boolean> {
    return TestBed.inject(Router).navigateByUrl('/elsewhere');
  }

  it('When there are no unsaved edits, then the user leaves without a question', async () => {
    expect(await leave()).toBe(true);
    expect(await dialogs.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    expect(TestBed.inject(Router).url).toBe('/elsewhere');
  });

  it('When there are unsaved edits and the user stays, then the page stays', async () => {
    page.edited.set(3);
    const leaving = leave();
    const dialog = await openDialog();
    expect(dialog.text).toContain('3 cells have edits that are not saved');
    dialog.click('Stay');

    expect(await leaving).toBe(false);
    expect(TestBed.inject(Router).url).toBe('/table');
  });

  it('When there are unsaved edits and the user leaves and discards, then the user leaves', async () => {
    page.edited.set(1);
    const leaving = leave();
    const dialog = await openDialog();
    expect(dialog.text).toContain('1 cell has edits');
    dialog.click('Leave and discard');

    expect(await leaving).toBe(true);
    expect(TestBed.inject(Router).url).toBe('/elsewhere');
  });
});

describe('the tables routes', () => {
  it('When the workspace route is read, then leaving it goes through the unsaved-edits guard', async () => {
    const { default: tablesRoutes } = await import('../tables.routes');
    expect(tablesRoutes.find((route) => route.path === ':id')?.canDeactivate).toEqual([
      unsavedEditsGuard,
    ]);
  });
});
