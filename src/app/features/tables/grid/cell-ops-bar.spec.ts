import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { noAnimations } from '../../../../testing/harness-helpers';
import type { CellOperation } from './cell-operations';
import { CellOpsBar } from './cell-ops-bar';

describe('CellOpsBar', () => {
  let fixture: ComponentFixture<CellOpsBar>;
  let loader: HarnessLoader;
  let asked: (CellOperation | boolean)[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [noAnimations] });
    fixture = TestBed.createComponent(CellOpsBar);
    loader = TestbedHarnessEnvironment.loader(fixture);
    asked = [];
    fixture.componentInstance.operate.subscribe((op) => asked.push(op));
    fixture.componentInstance.lock.subscribe((isLocked) => asked.push(isLocked));
    await fixture.whenStable();
  });

  const click = async (text: string | RegExp) =>
    (await loader.getHarness(MatButtonHarness.with({ text }))).click();

  it('When the amount is typed and each button pressed, then each asks for its operation', async () => {
    await (await loader.getHarness(MatInputHarness)).setValue('-2.5');
    await click('Scale %');
    await click('Offset');
    await click('Set');
    await click('Smooth');
    await click('Fill gaps');
    await click(/Lock$/);
    await click(/Unlock$/);
    await click(/Blend across/);
    await (await loader.getHarness(MatMenuHarness)).clickItem({ text: /four corners/ });
    expect(asked).toEqual([
      { kind: 'scale', percent: -2.5 },
      { kind: 'offset', points: -2.5 },
      { kind: 'set', value: -2.5 },
      { kind: 'smooth' },
      { kind: 'fillGaps' },
      true,
      false,
      { kind: 'blend', direction: 'both' },
    ]);
  });

  it('When the field is empty, then the amount goes as NaN for the store to refuse', async () => {
    await (await loader.getHarness(MatInputHarness)).setValue('');
    await click('Scale %');
    expect(asked).toHaveLength(1);
    expect(Number.isNaN((asked[0] as { percent: number }).percent)).toBe(true);
  });

  it('When disabled, then the buttons are disabled and the hint says why', async () => {
    fixture.componentRef.setInput('disabled', true);
    fixture.componentRef.setInput('hint', 'Select cells in the grid to change them.');
    await fixture.whenStable();
    expect(
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Smooth' }))).isDisabled(),
    ).toBe(true);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'Select cells in the grid to change them.',
    );
  });
});
